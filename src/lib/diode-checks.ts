/**
 * Freewheel diode checks [docs/engineering.md §8]: across the motor, cathode to +V.
 */
import { fmt, makeCheck, marginBelow, type Check } from './checks.ts';
import type { DiodeParams } from './domain/parts.ts';

/** Keep t_rr below about 1 % of the PWM period [practice]. */
export const TRR_SHARE_OF_PERIOD = 0.01;
/** Stray loop inductance of a compact layout and a typical small-MOSFET turn-off, for the spike estimate [practice, judgement]. */
export const DEFAULT_LOOP_INDUCTANCE_H = 20e-9;
export const DEFAULT_TURN_OFF_S = 100e-9;
/** Half-sine surge duration most datasheets state IFSM for (8.3 ms, 60 Hz half cycle; shorter of the common two). */
const SURGE_PULSE_S = 8.3e-3;

/** Energy dumped into a switch that turns off an inductive current with no freewheel path: ½·L·I² [docs/engineering.md §8]. */
export function avalancheEnergyJ(inductanceH: number, currentA: number): number {
  return 0.5 * inductanceH * currentA ** 2;
}

export function avalanchePowerW(inductanceH: number, currentA: number, frequencyHz: number): number {
  return avalancheEnergyJ(inductanceH, currentA) * frequencyHz;
}

/** Drain spike ≈ V_supply + V_F + L_loop·di/dt [docs/engineering.md §8]. */
export function drainSpikeV(supplyV: number, forwardV: number, loopInductanceH: number, diDtAPerS: number): number {
  return supplyV + forwardV + loopInductanceH * diDtAPerS;
}

export interface DiodeCheckInput {
  diode: DiodeParams;
  supplyMaxV: number;
  /** Worst (1 − D)·I over the duty range; ignored for on/off drive. */
  meanCurrentA: number;
  /**
   * Motor current the diode takes over at turn-off: under PWM the repetitive peak (ripple peak, jam included),
   * for on/off the one-off current at a turn-off, up to the worst-case stall current.
   */
  peakCurrentA: number;
  /** Ambient for the diode's own junction (hottest case). */
  ambientC?: number;
  /** Worst (1 − D)·Is,pwm while jammed under PWM (0 for on/off). */
  stallMeanCurrentA?: number;
  pwmHz: number | null;
  voltageDerating: number;
  motorInductanceH?: number | null;
  motorResistanceOhm?: number | null;
  loopInductanceH?: number;
  turnOffS?: number;
}

/** Judged against the derated VRRM (limit = VRRM·derating, ok ⇔ value ≤ limit); above VRRM itself a hard fail. */
function checkReverseVoltage(d: DiodeParams, supplyMaxV: number, derating: number): Check {
  const deratedV = d.vrrmV * derating;
  const hardOk = supplyMaxV <= d.vrrmV;
  const ok = supplyMaxV <= deratedV;
  const note = ok
    ? `Supply up to ${fmt(supplyMaxV)} V is within VRRM ${fmt(d.vrrmV)} V derated to ${fmt(deratedV)} V.`
    : `Supply up to ${fmt(supplyMaxV)} V exceeds VRRM ${hardOk ? `${fmt(d.vrrmV)} V derated to ${fmt(deratedV)} V` : `${fmt(d.vrrmV)} V itself`}: ` +
      `choose a diode rated at least ${fmt(supplyMaxV / derating)} V.`;
  return makeCheck(
    { id: 'reverse-voltage', ok, value: supplyMaxV, limit: deratedV, unit: 'V', margin: marginBelow(supplyMaxV, deratedV), note },
    hardOk ? 'margin' : 'hard',
  );
}

/** Without a stated IFRM, take 2 × IF(AV) as the repetitive peak a small rectifier tolerates [practice, rule of thumb]. */
export const IFRM_FROM_IFAV_FACTOR = 2;

/**
 * Hard, under PWM: the current handed over at every turn-off (the ripple peak, a jam included) against the
 * repetitive peak rating IFRM (or the rule of thumb) [docs/engineering.md §8].
 */
function checkRepetitivePeak(d: DiodeParams, peakA: number): Check {
  const stated = d.ifrmA != null;
  const limitA = stated ? (d.ifrmA as number) : IFRM_FROM_IFAV_FACTOR * d.ifAvA;
  const basis = stated
    ? `IFRM ${fmt(limitA)} A`
    : `${fmt(limitA)} A (no IFRM on record: ${IFRM_FROM_IFAV_FACTOR} × IF(AV), a rule of thumb)`;
  const ok = peakA <= limitA;
  const note = ok
    ? `Every turn-off hands the diode up to ${fmt(peakA)} A, within ${basis}.`
    : `Every turn-off hands the diode up to ${fmt(peakA)} A, above ${basis}: choose a diode with a higher repetitive peak rating.`;
  return makeCheck({ id: 'peak-current', ok, value: peakA, limit: limitA, unit: 'A', margin: marginBelow(peakA, limitA), note });
}

/**
 * Hard: the diode's own junction Tj,d = TA + VF·I_F(AV)·RθJA,d ≤ Tj,max,d at the worst mean current, a jam under
 * PWM included [docs/engineering.md §6]. On/off drive leaves only brief decays: nothing steady to heat it.
 */
function checkDiodeThermal(d: DiodeParams, meanA: number, ambientC: number, pwmHz: number | null): Check {
  const id = 'diode-thermal';
  if (pwmHz == null) {
    return makeCheck({
      id,
      ok: true,
      value: null,
      limit: d.tjMaxC,
      unit: '°C',
      margin: null,
      note: 'On/off drive: the diode carries only the brief decay after each turn-off, no steady heat.',
    });
  }
  if (d.rthJaCPerW == null || d.tjMaxC == null) {
    const note = `The diode's RθJA or Tj,max is not on record, so its junction at ${fmt(meanA)} A mean cannot be verified: add them from the datasheet.`;
    return makeCheck({ id, ok: false, value: null, limit: d.tjMaxC, unit: '°C', margin: null, note });
  }
  const junctionC = ambientC + d.vfV * meanA * d.rthJaCPerW;
  const ok = junctionC <= d.tjMaxC;
  const rise = d.tjMaxC - ambientC;
  const note = ok
    ? `At ${fmt(meanA)} A mean (a jam under PWM included) the diode's junction reaches about ${fmt(junctionC)} °C, within Tj,max ${fmt(d.tjMaxC)} °C.`
    : `At ${fmt(meanA)} A mean (a jam under PWM included) the diode's junction would reach about ${fmt(junctionC)} ` +
      `°C, above Tj,max ${fmt(d.tjMaxC)} °C: choose a larger package or a lower-VF diode, or limit the stall current.`;
  return makeCheck({
    id,
    ok,
    value: junctionC,
    limit: d.tjMaxC,
    unit: '°C',
    margin: rise > 0 ? (d.tjMaxC - junctionC) / rise : null,
    note,
  });
}

function checkMeanCurrent(d: DiodeParams, meanA: number, pwmHz: number | null): Check {
  if (pwmHz == null) {
    const note = 'On/off drive: the diode carries only the brief decay after each turn-off.';
    return makeCheck({ id: 'mean-current', ok: true, value: 0, limit: d.ifAvA, unit: 'A', margin: 1, note });
  }
  const ok = meanA <= d.ifAvA;
  const note = ok
    ? `Mean freewheel current ${fmt(meanA)} A is within IF(AV) ${fmt(d.ifAvA)} A.`
    : `Mean freewheel current ${fmt(meanA)} A exceeds IF(AV) ${fmt(d.ifAvA)} A: choose a diode rated at least ${fmt(meanA)} A.`;
  return makeCheck({ id: 'mean-current', ok, value: meanA, limit: d.ifAvA, unit: 'A', margin: marginBelow(meanA, d.ifAvA), note });
}

/** On/off: a turn-off (at worst after a jam) is a rare one-off event, judged against the surge rating IFSM. */
function checkOneOffPeak(d: DiodeParams, peakA: number): Check {
  const ok = peakA <= d.ifsmA;
  const note = ok
    ? `A turn-off hands the diode up to ${fmt(peakA)} A once (after a jam), within its ${fmt(d.ifsmA)} A surge rating IFSM.`
    : `A turn-off hands the diode up to ${fmt(peakA)} A, above even its ${fmt(d.ifsmA)} A surge rating: choose a larger diode.`;
  return makeCheck({ id: 'peak-current', ok, value: peakA, limit: d.ifsmA, unit: 'A', margin: marginBelow(peakA, d.ifsmA), note });
}

/** Informative: the motor's decay I²·τe/2 against the surge rating's half-sine IFSM²·t/2. */
function surgeInfo(d: DiodeParams, peakA: number, inductanceH: number | null | undefined, resistanceOhm: number | null | undefined): Check {
  if (inductanceH == null || resistanceOhm == null || resistanceOhm <= 0) {
    return makeCheck({
      id: 'surge-current',
      ok: true,
      value: null,
      limit: null,
      unit: 'A²s',
      margin: null,
      note: 'Motor inductance unknown: surge stress not estimated (it rarely limits small motors).',
    });
  }
  const decayI2t = (peakA ** 2 * (inductanceH / resistanceOhm)) / 2;
  const ratingI2t = (d.ifsmA ** 2 * SURGE_PULSE_S) / 2;
  const note = `Decay stress about ${fmt(decayI2t)} A²s against about ${fmt(ratingI2t)} A²s for the surge rating: informative only.`;
  return makeCheck({
    id: 'surge-current',
    ok: true,
    value: decayI2t,
    limit: ratingI2t,
    unit: 'A²s',
    margin: marginBelow(decayI2t, ratingI2t),
    note,
  });
}

function checkReverseRecovery(d: DiodeParams, pwmHz: number | null): Check {
  if (pwmHz == null) {
    return makeCheck({
      id: 'reverse-recovery',
      ok: true,
      // A Schottky has no stored charge: no recovery time to show (a "0" on record reads as a measured 0 ns).
      value: d.kind === 'schottky' ? null : d.trrNs,
      limit: null,
      unit: 'ns',
      margin: null,
      note: 'On/off drive: reverse recovery does not matter; any rectifier type will do.',
    });
  }
  const limitNs = (TRR_SHARE_OF_PERIOD / pwmHz) * 1e9;
  if (d.kind === 'schottky') {
    return makeCheck({
      id: 'reverse-recovery',
      ok: true,
      value: null,
      limit: limitNs,
      unit: 'ns',
      margin: null,
      note: 'Schottky: no stored charge (no reverse recovery to speak of), suited to PWM.',
    });
  }
  if (d.trrNs == null) {
    const note = `Reverse recovery time not on record for this ${d.kind} diode: confirm it is below ${fmt(limitNs)} ns (1 % of the PWM period).`;
    return makeCheck({ id: 'reverse-recovery', ok: false, value: null, limit: limitNs, unit: 'ns', margin: null, note }, 'margin');
  }
  const ok = d.trrNs <= limitNs;
  const kindHint = d.kind === 'general' ? 'a general-purpose rectifier recovers in microseconds and ' : '';
  const note = ok
    ? `t_rr ${fmt(d.trrNs)} ns is below 1 % of the PWM period (${fmt(limitNs)} ns).`
    : `t_rr ${fmt(d.trrNs)} ns exceeds 1 % of the PWM period (${fmt(limitNs)} ns): ${kindHint}each recovery adds a current spike and loss in the switch; use a Schottky or ultrafast diode.`;
  return makeCheck({ id: 'reverse-recovery', ok, value: d.trrNs, limit: limitNs, unit: 'ns', margin: marginBelow(d.trrNs, limitNs), note });
}

function spikeInfo(d: DiodeParams, input: DiodeCheckInput): Check {
  const loopH = input.loopInductanceH ?? DEFAULT_LOOP_INDUCTANCE_H;
  const turnOffS = input.turnOffS ?? DEFAULT_TURN_OFF_S;
  const spikeV = drainSpikeV(input.supplyMaxV, d.vfV, loopH, input.peakCurrentA / turnOffS);
  const note = `Drain spike estimate ${fmt(spikeV)} V with ${fmt(loopH * 1e9)} nH of loop and a ${fmt(turnOffS * 1e9)} ns turn-off: keep the diode close to the motor terminals and the switch.`;
  return makeCheck({ id: 'drain-spike', ok: true, value: spikeV, limit: null, unit: 'V', margin: null, note });
}

export function checkDiode(input: DiodeCheckInput): Check[] {
  const d = input.diode;
  return [
    checkReverseVoltage(d, input.supplyMaxV, input.voltageDerating),
    checkMeanCurrent(d, input.meanCurrentA, input.pwmHz),
    input.pwmHz == null ? checkOneOffPeak(d, input.peakCurrentA) : checkRepetitivePeak(d, input.peakCurrentA),
    checkDiodeThermal(d, Math.max(input.meanCurrentA, input.stallMeanCurrentA ?? 0), input.ambientC ?? 25, input.pwmHz),
    surgeInfo(d, input.peakCurrentA, input.motorInductanceH, input.motorResistanceOhm),
    checkReverseRecovery(d, input.pwmHz),
    spikeInfo(d, input),
  ];
}
