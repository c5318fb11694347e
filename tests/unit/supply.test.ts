/**
 * The supply checks [docs/engineering.md §supply; docs/engineering.md §3]. Every expected value is re-derived here
 * from the formulas with the numbers of the worked example, never read back from the code under test:
 *   R = V/Is at 20 °C; R(T) = R20·(1 + 0.00393·(T − 20)) [IEC 60028, copper α20];
 *   ω0 = n0·2π/60; Ke = Kt = (V − I0·R)/ω0 [docs/engineering.md §2];
 *   I_start = V/(R_cold + R_s + R_int); held at min(I_start, I_lim); terminals see I·(R_cold + R_s);
 *   start torque Kt·(I − I0); running I0 + T/Kt; τm = J·R_loop/(Kt·Ke);
 *   C ≥ (I_start − I_avail)·τm/ΔV, I_avail = min(ΔV/R_int, I_lim) [docs/engineering.md §supply].
 * Port limits 0.5 A and 0.9 A [std: USB 2.0 / USB 3.x specifications].
 */
import { describe, expect, it } from 'vitest';
import { calcSupplyRequestSchema, parseCalcBody, type CalcSupplyRequest } from '../../src/lib/schemas/calc.ts';
import { calcSupply } from '../../src/lib/supply.ts';
import { supplyReportForCase } from '../../src/lib/supply-design.ts';
import { designCaseOf } from '../../src/lib/design-input.ts';
import { demoDesigns } from '../../db/seeds/designs.ts';
import { demoMotors } from '../../db/seeds/data/motors.ts';
import { SUPPLY_PRESETS, type DesignInput } from '../../src/lib/domain/design.ts';
import type { MotorParams } from '../../src/lib/domain/parts.ts';

// Worked example M1 (docs/engineering.md §2 / §11, invented): 3 V, 12 000 rpm, I0 0.20 A, Is 1.80 A.
const V = 3;
const I0 = 0.2;
const IS = 1.8;
const R = V / IS; // 1.6667 Ω
const OMEGA0 = (12000 * 2 * Math.PI) / 60;
const KE = (V - I0 * R) / OMEGA0; // = Kt, 2.12207e-3
const ALPHA = 0.00393; // IEC 60028

const M1 = {
  ratedVoltageV: 3,
  noLoadSpeedRpm: 12000,
  noLoadCurrentA: 0.2,
  stallCurrentA: 1.8,
  stallTorqueNm: 0.0033953,
  rotorInertiaKgM2: 1.5e-7,
};
const CONTRACT = {
  motor: M1,
  supply: { voltageV: 3.0, internalResistanceOhm: 0.3, continuousCurrentA: 1.0, currentLimitA: 0.5 },
  seriesResistanceOhm: 0,
  windingC: 20,
  loadTorqueNm: 0.0003,
  logic: { sharedWithMotor: true, minSupplyV: 2.7, regulatorDropoutV: 0 },
  allowedDipV: 0.2,
};

function run(body: unknown) {
  const parsed = parseCalcBody(calcSupplyRequestSchema, body);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues));
  return calcSupply(parsed.data as CalcSupplyRequest);
}
const check = (r: ReturnType<typeof run>, id: string) => r.checks.find((c) => c.id === id);

describe('supply: worked example of docs/engineering.md §3 (re-derived)', () => {
  const r = run(CONTRACT);
  const iStart = 3.0 / (R + 0.3); // 3.0/1.9667 = 1.5254 A

  it('start current V/(R + R_int) = 1.5254 A; the source would sag by 0.4576 V to 2.542 V', () => {
    expect(iStart).toBeCloseTo(1.5254, 4); // docs/engineering.md §3 figure
    expect(r.startCurrentA).toBeCloseTo(iStart, 9);
    // Unlimited sag: I_start·R_int = 0.4576 V, terminals 2.542 V (the same source without its limit).
    const unlimited = run({ ...CONTRACT, supply: { voltageV: 3.0, internalResistanceOhm: 0.3 } });
    expect(3.0 - unlimited.sourceVoltageAtStartV).toBeCloseTo(iStart * 0.3, 9);
    expect(iStart * 0.3).toBeCloseTo(0.4576, 4);
    expect(unlimited.sourceVoltageAtStartV).toBeCloseTo(2.542, 3);
  });

  it('on the 0.5 A port [std: USB 2.0]: held at 0.5 A, start torque Kt·(0.5 − 0.2) = 0.6366 mN·m, terminals 0.5·R', () => {
    expect(r.startActualCurrentA).toBe(0.5);
    expect(KE * 0.3).toBeCloseTo(0.6366e-3, 7); // docs/engineering.md §3 figure
    expect(r.startTorqueNm).toBeCloseTo(KE * (0.5 - I0), 10);
    expect((KE * 0.3) / (KE * (IS - I0))).toBeCloseTo(0.1875, 4); // 18.75 % of the stall torque
    expect(r.sourceVoltageAtStartV).toBeCloseTo(0.5 * R, 9);
  });

  it('τm = J·R_loop/(Kt·Ke) = 65.5 ms; I_avail = min(0.2/0.3, 0.5) = 0.5 A; C ≥ 0.336 F, called impractical', () => {
    const tau = (1.5e-7 * (R + 0.3)) / (KE * KE);
    expect(tau * 1000).toBeCloseTo(65.5, 1);
    const c = ((iStart - Math.min(0.2 / 0.3, 0.5)) * tau) / 0.2;
    expect(c).toBeCloseTo(0.336, 3);
    expect(r.bulkCapacitanceF).toBeCloseTo(c, 9);
    expect(r.notes.join(' ')).toMatch(/not practical/);
    expect(r.notes.join(' ')).toMatch(/separate supply|soft start/);
  });

  it('running current at 0.3 mN·m: I0 + T/Kt = 0.3414 A, within the 1 A rating', () => {
    expect(I0 + 0.0003 / KE).toBeCloseTo(0.3414, 4);
    expect(r.runningCurrentA).toBeCloseTo(I0 + 0.0003 / KE, 9);
    expect(check(r, 'supply-running-current')).toMatchObject({ ok: true, limit: 1 });
  });

  it('checks: start above the limit but turning = marginal (slow start); shared controller at 0.833 V < 2.7 V = fail', () => {
    expect(check(r, 'supply-start-current')).toMatchObject({ ok: false, severity: 'margin', value: iStart, limit: 0.5 });
    expect(check(r, 'logic-brownout')).toMatchObject({ ok: false, severity: 'hard', limit: 2.7 });
    expect(r.verdict).toBe('fail');
  });
});

describe('supply: current-limited starts', () => {
  it('never starts: a 1.0 mN·m load against 0.6366 mN·m at the 0.5 A limit is a fail with the break-away current named', () => {
    const r = run({ motor: M1, supply: { voltageV: 3, currentLimitA: 0.5 }, loadTorqueNm: 0.001 });
    const c = check(r, 'supply-start-current')!;
    expect(c.ok).toBe(false);
    expect(c.severity).toBe('hard');
    expect(r.verdict).toBe('fail');
    // break-away I0 + T/Kt = 0.2 + 0.001/2.122e-3 = 0.671 A
    expect(c.note).toContain(String(Number((I0 + 0.001 / KE).toPrecision(3))));
    expect(c.note).toMatch(/never starts/);
  });

  it('starts slowly: the same port with a 0.3 mN·m load is marginal, not a fail', () => {
    const r = run({ motor: M1, supply: { voltageV: 3, currentLimitA: 0.5 }, loadTorqueNm: 0.0003 });
    expect(check(r, 'supply-start-current')).toMatchObject({ ok: false, severity: 'margin' });
    expect(r.verdict).toBe('marginal');
  });

  it('a 0.9 A port [std: USB 3.x] still limits M1 (1.8 A start) and gives Kt·(0.9 − 0.2) = 1.4854 mN·m', () => {
    const r = run({ motor: M1, supply: { voltageV: 3, currentLimitA: 0.9 }, loadTorqueNm: 0.0012 });
    expect(r.startTorqueNm).toBeCloseTo(KE * 0.7, 10);
    expect(check(r, 'supply-start-current')).toMatchObject({ ok: false, severity: 'margin' });
  });

  it('a limit above the start current holds: 2 A against 1.8 A', () => {
    const r = run({ motor: M1, supply: { voltageV: 3, currentLimitA: 2 } });
    expect(check(r, 'supply-start-current')!.ok).toBe(true);
    expect(check(r, 'supply-start-current')!.value).toBeCloseTo(1.8, 9); // V/R = Is at 20 °C
    expect(r.verdict).toBe('pass');
  });

  it('a cold winding draws more: at −20 °C, R·(1 + 0.00393·(−40)) [IEC 60028]', () => {
    const r = run({ motor: M1, supply: { voltageV: 3 }, windingC: -20 });
    expect(r.startCurrentA).toBeCloseTo(3 / (R * (1 + ALPHA * -40)), 9);
    expect(r.startCurrentA).toBeGreaterThan(1.8);
  });
});

describe('supply: shared controller rail', () => {
  const base = { motor: M1, supply: { voltageV: 3, internalResistanceOhm: 0.3 } };

  it('brown-out: the source sags to 3·R/(R + 0.3) = 2.542 V, below a 2.7 V controller', () => {
    const r = run({ ...base, logic: { sharedWithMotor: true, minSupplyV: 2.7 } });
    const c = check(r, 'logic-brownout')!;
    expect(c.value).toBeCloseTo((3 * R) / (R + 0.3), 9);
    expect(c.ok).toBe(false);
    expect(r.verdict).toBe('fail');
    expect(r.notes.join(' ')).toMatch(/supply of its own/);
    // soft start: keep I under (3 − 2.7)/0.3 = 1.0 A
    expect(r.notes.join(' ')).toMatch(/PWM ramp.*1000 mA/);
  });

  it('a regulator dropout adds to the need: 2.2 V + 0.3 V = 2.5 V holds at 2.542 V, 2.3 V + 0.3 V does not', () => {
    expect(check(run({ ...base, logic: { minSupplyV: 2.2, regulatorDropoutV: 0.3 } }), 'logic-brownout')).toMatchObject({
      ok: true,
      limit: 2.5,
    });
    expect(check(run({ ...base, logic: { minSupplyV: 2.3, regulatorDropoutV: 0.3 } }), 'logic-brownout')!.ok).toBe(false);
  });

  it('the fix by a separate supply: the controller off this source, no brown-out check and a pass', () => {
    const r = run({ ...base, logic: { sharedWithMotor: false, minSupplyV: 2.7 } });
    expect(check(r, 'logic-brownout')).toBeUndefined();
    expect(r.verdict).toBe('pass');
    expect(run(base).checks).toHaveLength(0);
  });
});

describe('supply: bulk capacitance', () => {
  it('no figure without the rotor inertia, and a note that says why', () => {
    const { rotorInertiaKgM2: _j, ...noJ } = M1;
    const r = run({ ...CONTRACT, motor: noJ });
    expect(r.bulkCapacitanceF).toBeNull();
    expect(r.notes.join(' ')).toMatch(/rotor inertia/);
  });

  it('no figure without an allowed dip', () => {
    expect(run({ motor: M1, supply: { voltageV: 3, internalResistanceOhm: 0.3 } }).bulkCapacitanceF).toBeNull();
  });

  it('an ideal source with no limit (R_int 0) needs none', () => {
    expect(run({ motor: M1, supply: { voltageV: 3 }, allowedDipV: 0.2 }).bulkCapacitanceF).toBe(0);
  });

  it('a small figure is given in µF/mF, not called impractical: R_int 0.1 Ω, 0.5 V dip', () => {
    const iStart = 3 / (R + 0.1);
    const tau = (1.5e-7 * (R + 0.1)) / (KE * KE);
    const c = ((iStart - 0.5 / 0.1) * tau) / 0.5; // I_avail 5 A > I_start: none needed
    expect(c).toBeLessThan(0);
    const r = run({ motor: M1, supply: { voltageV: 3, internalResistanceOhm: 0.1 }, allowedDipV: 0.5 });
    expect(r.bulkCapacitanceF).toBe(0);
    const r2 = run({ motor: M1, supply: { voltageV: 3, internalResistanceOhm: 1 }, allowedDipV: 1 });
    const i2 = 3 / (R + 1);
    const c2 = ((i2 - 1 / 1) * ((1.5e-7 * (R + 1)) / (KE * KE))) / 1;
    expect(r2.bulkCapacitanceF).toBeCloseTo(c2, 9);
    expect(c2).toBeLessThan(0.1);
    expect(r2.notes.join(' ')).not.toMatch(/not practical/);
  });
});

describe('supply: bad bodies name the field', () => {
  it.each([
    ['zero supply', { motor: M1, supply: { voltageV: 0 } }, 'supply.voltageV'],
    ['negative rated voltage', { motor: { ...M1, ratedVoltageV: -3 }, supply: { voltageV: 3 } }, 'motor.ratedVoltageV'],
    ['limit 0', { motor: M1, supply: { voltageV: 3, currentLimitA: 0 } }, 'supply.currentLimitA'],
    ['continuous rating negative', { motor: M1, supply: { voltageV: 3, continuousCurrentA: -1 } }, 'supply.continuousCurrentA'],
    ['dip at the supply', { motor: M1, supply: { voltageV: 3 }, allowedDipV: 3 }, 'allowedDipV'],
    ['no-load at stall', { motor: { ...M1, noLoadCurrentA: 1.8 }, supply: { voltageV: 3 } }, 'motor.noLoadCurrentA'],
    ['negative internal resistance', { motor: M1, supply: { voltageV: 3, internalResistanceOhm: -0.1 } }, 'supply.internalResistanceOhm'],
    ['controller minimum 0', { motor: M1, supply: { voltageV: 3 }, logic: { minSupplyV: 0 } }, 'logic.minSupplyV'],
    ['missing supply voltage', { motor: M1, supply: {} }, 'supply.voltageV'],
  ])('%s → %s', (_name, body, path) => {
    const parsed = parseCalcBody(calcSupplyRequestSchema, body);
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.issues.map((i) => i.path)).toContain(path);
  });
});

describe('supply of a design at its worst cases', () => {
  const motor = demoMotors.find((m) => m.mpn === 'HVM-260P-060A')!.params;
  const demo = demoDesigns.find((d) => d.name.startsWith('P-20 bench prototype'))!;
  const { motorMpn: _m, ready: _r, laterRevisions = [], ...rev1 } = demo;
  const input1 = { ...rev1, motor: { source: 'catalogue', partId: 1 }, selections: {} } as unknown as DesignInput;
  const input2 = { ...input1, ...laterRevisions[0] } as DesignInput;
  // HVM-260P-060A (invented): measured R 3 Ω, 6 V, 9000 rpm, I0 0.15 A → Kt = (6 − 0.45)/(9000·π/30).
  const kt = (6 - 0.15 * 3) / ((9000 * Math.PI) / 30);

  it('rev 1 on the 0.5 A USB 2.0 port: 1.70 A asked, never starts against 3 mN·m, controller browns out', () => {
    const r = supplyReportForCase(designCaseOf(input1, motor));
    // start at the highest supply 5.25 V, winding at the coldest ambient 15 °C, 0.15 Ω cable
    const rCold = 3 * (1 + ALPHA * (15 - 20));
    expect(r.startCurrentA).toBeCloseTo(5.25 / (rCold + 0.15), 9);
    expect(r.startCurrentA).toBeCloseTo(1.7, 2);
    expect(r.startTorqueNm).toBeCloseTo(kt * (0.5 - 0.15), 10); // 2.06 mN·m < 3 mN·m
    expect(check(r as never, 'supply-start-current')).toMatchObject({ ok: false, severity: 'hard' });
    // brown-out at the lowest supply, coldest winding: 0.5 A · (R_cold + 0.15 Ω) against 3.0 + 0.3 V
    expect(r.sourceVoltageAtStartV).toBeCloseTo(0.5 * (rCold + 0.15), 9);
    expect(check(r as never, 'logic-brownout')).toMatchObject({ ok: false, limit: 3.3 });
    // running at 3 mN·m: I0 + T/Kt = 0.659 A > 0.5 A port
    expect(r.runningCurrentA).toBeCloseTo(0.15 + 0.003 / kt, 9);
    expect(check(r as never, 'supply-running-current')!.ok).toBe(false);
    expect(r.verdict).toBe('fail');
  });

  it('rev 2 with its own 4 × AA NiMH pack (0.12 Ω) and the controller separate: every supply check passes', () => {
    const r = supplyReportForCase(designCaseOf(input2, motor));
    expect(r.verdict).toBe('pass');
    expect(r.checks.map((c) => c.id).sort()).toEqual(['supply-motor-voltage', 'supply-running-current']);
    // weakest start: 4.0 V with the winding at 35 °C, no limit: Kt·(4.0/(R_hot + 0.05 + 0.12) − I0) > 3 mN·m
    const rHot = 3 * (1 + ALPHA * 15);
    expect(r.startTorqueNm).toBeCloseTo(kt * (4.0 / (rHot + 0.17) - 0.15), 10);
    expect(r.startTorqueNm).toBeGreaterThan(0.003);
  });

  it('brown-out worst case is the lowest supply: raising only the maximum leaves the sag unchanged', () => {
    const higher = { ...input1, supply: { ...input1.supply, maxV: 6 } };
    expect(supplyReportForCase(designCaseOf(higher, motor)).sourceVoltageAtStartV).toBeCloseTo(
      supplyReportForCase(designCaseOf(input1, motor)).sourceVoltageAtStartV,
      12,
    );
  });

  it('supply against the motor [practice]: above the rated maximum marginal, above 1.5× a fail', () => {
    const at = (maxV: number, params: MotorParams = motor) =>
      supplyReportForCase(designCaseOf({ ...input2, supply: { ...input2.supply, maxV } }, params)).checks.find(
        (c) => c.id === 'supply-motor-voltage',
      )!;
    expect(at(7.2).ok).toBe(true); // = voltageMaxV 7.2 V
    expect(at(8)).toMatchObject({ ok: false, severity: 'margin', limit: 7.2 });
    expect(at(7.2 * 1.5 + 0.1)).toMatchObject({ ok: false, severity: 'hard' });
    // no stated maximum: the rated voltage (6 V) is the line
    expect(at(6.5, { ...motor, voltageMaxV: null })).toMatchObject({ ok: false, limit: 6 });
  });

  it('stall-only load: start judged against friction only, running check at the no-load current', () => {
    const r = supplyReportForCase(designCaseOf({ ...input1, load: { kind: 'stall-only' } }, motor));
    expect(r.runningCurrentA).toBe(0.15);
    expect(check(r as never, 'supply-start-current')!.severity).toBe('margin'); // 0.5 A > I0: it turns, slowly
  });
});

describe('supply presets', () => {
  it('USB ports carry their specification limits [std: USB 2.0 0.5 A / USB 3.x 0.9 A]', () => {
    expect(SUPPLY_PRESETS.find((p) => p.id === 'usb2-port')).toMatchObject({ currentLimitA: 0.5 });
    expect(SUPPLY_PRESETS.find((p) => p.id === 'usb3-port')).toMatchObject({ currentLimitA: 0.9 });
  });

  it('cell packs: per cell × cells, marked as from memory (4 × NiMH ~0.03 Ω = 0.12 Ω)', () => {
    const nimh = SUPPLY_PRESETS.find((p) => p.id === '4xAA-nimh')!;
    expect(nimh.internalResistanceOhm).toBeCloseTo(4 * 0.03, 9);
    expect(nimh.source.internalResistance).toMatch(/\[mem\]/);
    for (const p of SUPPLY_PRESETS) expect(p.source.currentLimit.length).toBeGreaterThan(0);
  });
});
