/** Report sections 2–4: what the designer entered, the motor model with its curves, the worst case. */
import type { DesignInput } from '../../lib/domain/design.ts';
import type { DesignMatch, MotorView } from '../../lib/design-match.ts';
import { formatSi, torqueFromNm } from '../../lib/units.ts';
import { drawMotorCurves } from './report-chart.ts';
import { percent, quantity, sig } from './report-format.ts';
import { MUTED, type ReportLayout } from './report-layout.ts';

const torqueText = (torqueNm: number): string =>
  `${sig(torqueFromNm(torqueNm, 'mN·m'))} mN·m (${sig(torqueFromNm(torqueNm, 'g·cm'))} g·cm)`;

function motorPointsText(motor: MotorView): string {
  const p = motor.params;
  const parts = [
    `rated ${sig(p.ratedVoltageV)} V`,
    `no-load ${sig(p.noLoadSpeedRpm, 4)} rpm at ${quantity(p.noLoadCurrentA, 'A')}`,
    `stall ${quantity(p.stallCurrentA, 'A')} and ${torqueText(p.stallTorqueNm)}`,
  ];
  if (p.terminalResistanceOhm != null) parts.push(`terminal resistance ${quantity(p.terminalResistanceOhm, 'Ω')}`);
  if (p.inductanceH != null) parts.push(`inductance ${quantity(p.inductanceH, 'H')}`);
  return parts.join('; ');
}

function logicText(logic: DesignInput['logic']): [string, string][] {
  const pull =
    logic.resetPull === 'none'
      ? 'no internal pull (pin floats)'
      : `internal pull-${logic.resetPull} ${quantity(logic.resetPullOhms, 'Ω')} ±${percent(logic.resetPullTolerance)}`;
  return [
    ['Logic rail', `${sig(logic.railV)} V; output high at least ${sig(logic.highV)} V, output low at most ${sig(logic.lowV)} V`],
    ['Pin current', `source ${quantity(logic.pinSourceCurrentA, 'A')}, sink ${quantity(logic.pinSinkCurrentA, 'A')}`],
    ['Pin at reset', pull],
  ];
}

function driveText(drive: DesignInput['drive']): string {
  if (drive.mode === 'onoff') return 'On/off (no PWM)';
  return `PWM at ${formatSi(drive.frequencyHz, 'Hz', 3)}, duty ${percent(drive.dutyMin)} to ${percent(drive.dutyMax)}`;
}

function loadText(load: DesignInput['load']): string {
  if (load.kind === 'torque') return `Torque ${torqueText(load.torqueNm)} at the shaft`;
  if (load.kind === 'speed') return `Speed ${sig(load.speedRpm, 4)} rpm`;
  return 'Stall only (no running point given)';
}

export function drawInputs(layout: ReportLayout, input: DesignInput, motor: MotorView): void {
  layout.heading('Inputs');
  const s = input.supply;
  const seriesOhm = input.wiringResistanceOhm + input.shuntResistanceOhm;
  layout.keyValues([
    ['Motor', `${motor.label}: ${motorPointsText(motor)}`],
    ['Supply', `minimum ${sig(s.minV)} V, nominal ${sig(s.nomV)} V, maximum ${sig(s.maxV)} V${s.preset ? ` (preset ${s.preset})` : ''}`],
    [
      'Series resistance',
      `wiring ${quantity(input.wiringResistanceOhm, 'Ω')} + shunt ${quantity(input.shuntResistanceOhm, 'Ω')} = ${quantity(seriesOhm, 'Ω')}`,
    ],
    ...logicText(input.logic),
    ['Drive', driveText(input.drive)],
    ['Driver supply', input.driverSupplyV == null ? 'the motor supply (if a driver is needed)' : `${sig(input.driverSupplyV)} V`],
    ['Ambient', `${sig(input.ambientMinC)} °C to ${sig(input.ambientMaxC)} °C`],
    ['Load', loadText(input.load)],
    [
      'Margins',
      `voltage derating ${sig(input.margins.voltageDerating)}, thermal margin ${sig(input.margins.thermalMarginC)} K below Tj,max`,
    ],
    ['Board quantity', String(input.boardQuantity)],
  ]);
}

function operatingText(name: string, supplyV: number, op: MotorView['operatingMin']): string {
  if (op == null) return `At ${name} supply ${sig(supplyV)} V: no running point (stall-only load).`;
  return `At ${name} supply ${sig(supplyV)} V the load runs at ${torqueText(op.torqueNm)}, ${sig(op.speedRpm, 4)} rpm, ${quantity(op.currentA, 'A')}.`;
}

export function drawMotorModel(layout: ReportLayout, motor: MotorView): void {
  layout.heading('Motor model', 240);
  const m = motor.atMin;
  const c = m.consistency;
  layout.keyValues([
    ['Winding resistance R', `${quantity(m.resistanceOhm, 'Ω')} (at 20 °C)`],
    ['Ke = Kt', `${sig(m.keVsPerRad, 4)} V·s/rad = ${sig(m.ktNmPerA, 4)} N·m/A`],
    ['Friction torque', torqueText(m.frictionTorqueNm)],
    ['Consistency', `datasheet stall torque is ${sig(c.torqueRatio)} × the model's (accepted band 0.85–1.15)`],
  ]);
  if (c.warning) layout.paragraph(`Warning: ${c.warning}`, { bold: true });
  layout.gap(8);
  drawMotorCurves(layout, motor);
  layout.paragraph(operatingText('minimum', m.atSupply.supplyV, motor.operatingMin), { sizePt: 8.5, color: MUTED });
  layout.paragraph(operatingText('maximum', motor.atMax.atSupply.supplyV, motor.operatingMax), { sizePt: 8.5, color: MUTED });
  for (const [name, at] of [
    ['minimum', motor.atMin],
    ['maximum', motor.atMax],
  ] as const) {
    const a = at.atSupply;
    layout.paragraph(
      `Stall at ${name} supply ${sig(a.supplyV)} V: ${quantity(a.stallCurrentA, 'A')} and ${torqueText(a.stallTorqueNm)}; no-load ${sig(a.noLoadSpeedRpm, 4)} rpm.`,
      { sizePt: 8.5, color: MUTED },
    );
  }
}

export function drawWorstCase(layout: ReportLayout, match: DesignMatch): void {
  const w = match.worstCase;
  layout.heading('Worst case');
  layout.keyValues([
    [
      'Stall current (maximum)',
      `${quantity(w.stallCurrentMaxA, 'A')}: stall at ${sig(w.supplyMaxV)} V with the winding cold at ${sig(w.windingColdC)} °C`,
    ],
    ['Running current', `${quantity(w.runningCurrentA, 'A')} while the switch conducts`],
    ['Switch duty', w.pwmHz == null ? `${percent(w.switchDuty)} (on/off)` : `${percent(w.switchDuty)} at ${formatSi(w.pwmHz, 'Hz', 3)}`],
    ['Diode mean current', quantity(w.diodeMeanCurrentA, 'A')],
    ['Gate drive', `${sig(w.gateDriveMinV)} V minimum, ${sig(w.gateDriveMaxV)} V maximum (from the logic pin)`],
    ['Ambient (maximum)', `${sig(w.ambientMaxC)} °C`],
  ]);
}
