import { describe, expect, it } from 'vitest';
import { worstCaseOf } from '../../src/lib/design-case.ts';
import { rankDriverCandidates } from '../../src/lib/driver-ranking.ts';
import { rankDesign } from '../../src/lib/rank-design.ts';
import { rankDiodeCandidates, rankSwitchCandidates } from '../../src/lib/ranking.ts';
import { MOTOR_M1, caseM1 as caseM1Raw, diodePart, driverPart, mosfetPart } from './fixtures.ts';
import type { DesignCase } from '../../src/lib/design-case.ts';

/**
 * M1 with a 1 A stall current limit, so these rows isolate drive, rating and ranking behaviour: the small invented
 * parts here cannot survive an unprotected jam (see "sustained stall" below and tests/unit/stall-thermal.test.ts).
 */
const caseM1 = (o: Partial<DesignCase> = {}): DesignCase => caseM1Raw({ stallProtection: { kind: 'current-limit', limitA: 1 }, ...o });

const R_M1 = 3 / 1.8; // docs/engineering.md §2 M1
const KE_M1 = (3 - 0.2 * R_M1) / ((12000 * 2 * Math.PI) / 60); // docs/engineering.md §2 M1, re-derived

/** Logic-level part: RDS(on) specified from 2.5 V (invented). */
const logicLevel = mosfetPart(1, 'INV-N30L');
/** Standard-level part: VGS(th) up to 4 V, RDS(on) from 4.5 V (invented). */
const standardLevel = mosfetPart(2, 'INV-N30S', {
  vgsThMinV: 2,
  vgsThMaxV: 4,
  qgTotalNc: 10,
  qgTestVgsV: 10,
  qgsNc: 2,
  qgdNc: 3,
  vPlateauV: 4.4,
  rdsOn: [
    { vgsV: 4.5, tjC: 25, maxOhm: 0.06, typOhm: null, idA: 2 },
    { vgsV: 10, tjC: 25, maxOhm: 0.04, typOhm: null, idA: 2 },
  ],
});
const weakPart = mosfetPart(3, 'INV-N12T', { vdsMaxV: 4, idPulsedA: 2 });

describe('worst case (M1 case, mean-voltage model: inductance not known)', () => {
  const wc = worstCaseOf(caseM1({ motor: { ...MOTOR_M1, inductanceH: null } }));
  it('stall current at the highest supply and coldest winding', () => {
    expect(wc.stallCurrentMaxA).toBeCloseTo(3.3 / (R_M1 * (1 + 0.00393 * (-10 - 20))), 10); // IEC 60028 α20, docs/engineering.md §2
  });
  it('running current of a torque load is I0 + T/Kt, at full duty for the switch', () => {
    expect(wc.runningCurrentA).toBeCloseTo(0.2 + 0.0012 / KE_M1, 10); // docs/engineering.md §2
    expect(wc.switchDuty).toBe(1);
  });
  it('diode mean current is the worst (1 − D)·I over the duty range', () => {
    // re-derived: at each duty the motor either runs at I0 + T/Kt or, when the mean voltage cannot
    // beat the load, sits stalled at V_mean/R (docs/engineering.md §2–3, diode V_F 0.7 V default)
    let worstA = 0;
    for (const v of [2.7, 3.3]) {
      for (let k = 0; k <= 10; k += 1) {
        const d = 0.2 + 0.08 * k;
        const meanV = Math.max(0, d * v - (1 - d) * 0.7);
        const runs = KE_M1 * (meanV / R_M1 - 0.2) > 0.0012;
        worstA = Math.max(worstA, (1 - d) * (runs ? 0.2 + 0.0012 / KE_M1 : meanV / R_M1));
      }
    }
    expect(wc.diodeMeanCurrentA).toBeCloseTo(worstA, 10);
  });
});

describe('switch ranking', () => {
  it('puts a passing logic-level part first and fails the parts that break ratings', () => {
    const ranked = rankSwitchCandidates(caseM1(), [weakPart, standardLevel, logicLevel]);
    expect(ranked[0]).toMatchObject({ mpn: 'INV-N30L', verdict: 'pass' });
    expect(ranked.slice(1).map((r) => r.verdict)).toEqual(['fail', 'fail']);
    const weak = ranked.find((r) => r.mpn === 'INV-N12T');
    expect(weak?.checks.find((x) => x.id === 'drain-voltage')?.ok).toBe(false); // 3.3 V + 0.7 V vs 0.8·4 V (docs/engineering.md §5)
    expect(weak?.checks.find((x) => x.id === 'stall-current')?.ok).toBe(false); // cold stall > 2 A IDM
    const standard = ranked.find((r) => r.mpn === 'INV-N30S');
    expect(standard?.checks.find((x) => x.id === 'gate-drive')?.ok).toBe(false); // common practice: VGS(th) up to 4 V
  });

  it('a given gate driver lifts the standard-level part to pass', () => {
    const [r] = rankSwitchCandidates(caseM1(), [standardLevel], { voltageV: 10, sourceCurrentA: 1, sinkCurrentA: 1 });
    expect(r.verdict).toBe('pass');
  });

  it('P-channel parts are not low-side candidates', () => {
    const [r] = rankSwitchCandidates(caseM1(), [mosfetPart(4, 'INV-P30L', { channel: 'p' })]);
    expect(r.verdict).toBe('fail');
    expect(r.checks.find((c) => c.id === 'channel')?.note).toMatch(/high side/);
  });
});

describe('common practice: VGS(th) up to 4 V on a 3.3 V logic high', () => {
  const c = caseM1({
    logic: { ...caseM1().logic, highV: 3.3 },
    driverSupply: { minV: 4.75, maxV: 5.25 },
  });
  const drivers = [
    driverPart(10, 'INV-GD-CMOS', { inputLogic: 'ratio', inputHighMin: 0.7, inputLowMax: 0.3 }),
    driverPart(11, 'INV-GD-INV', { inverting: true }),
    driverPart(12, 'INV-GD-TTL'),
  ];
  const design = rankDesign(c, { mosfets: [standardLevel], drivers, diodes: [diodePart(20, 'INV-SD40')] });

  it('fails gate drive directly and asks for a driver with a 5 V or higher output', () => {
    expect(design.switch[0].checks.find((x) => x.id === 'gate-drive')?.ok).toBe(false); // common practice
    expect(design.driverNeeded).toBe(true);
    expect(design.requiredGateDriveV).toBe(4.5); // lowest RDS(on) spec VGS of the part
    expect(design.driverNeededNote).toMatch(/5 V or higher output/); // common practice: 5 V rail
    expect(design.switchWithDriver[0].verdict).toBe('pass');
  });

  it('ranks drivers: TTL input pass, inverting marginal (reset trap), CMOS-ratio input fail', () => {
    expect(design.driver.map((d) => [d.mpn, d.verdict])).toEqual([
      ['INV-GD-TTL', 'pass'],
      ['INV-GD-INV', 'marginal'], // docs/engineering.md §7 polarity trap: pin pulled down at reset turns the motor on
      ['INV-GD-CMOS', 'fail'], // docs/engineering.md §7: 0.7·5 V VIH > 3.3 V logic
    ]);
    expect(design.driver[0].pairing).toMatchObject({ switchMpn: 'INV-N30S', switchVerdict: 'pass', inverting: false });
    expect(design.powerOn?.motorCanStart).toBe(false); // pull-down through a non-inverting driver
  });

  it('drivers ranked directly for the switch agree', () => {
    expect(rankDriverCandidates(c, drivers, standardLevel)[0].mpn).toBe('INV-GD-TTL');
  });

  it('lists the standing cautions', () => {
    expect(design.cautions.some((x) => /freewheel diode/.test(x))).toBe(true); // docs/engineering.md §11
  });

  it('the workspace foot lists each caution once: none of those printed beside their step, the rest of the standing ones', () => {
    const other = design.otherCautions;
    expect(new Set(other).size).toBe(other.length);
    // printed with the motor, the supply and the diode steps (src/components/workspace), so not at the foot
    expect(other.some((x) => /^Stall heat:|^Inductive spike:|start-up current/.test(x))).toBe(false);
    // not printed elsewhere: batteries, low voltage only, engineering aid, the RθJA note (docs/engineering.md §11)
    for (const words of [/^Batteries:/, /^Low voltage only:/, /^Engineering aid:/, /RθJA/])
      expect(other.some((x) => words.test(x))).toBe(true);
    // the motor stays off (pull-down through a non-inverting driver): the unexpected start is not in step 7, so it stays here
    expect(other.some((x) => /^Unexpected start:/.test(x))).toBe(true);
    // every one of them is also among all the cautions the report prints
    for (const x of other) expect(design.cautions).toContain(x);
  });
});

describe('design with direct drive', () => {
  it('needs no driver when a logic-level part passes', () => {
    const d = rankDesign(caseM1(), { mosfets: [logicLevel, standardLevel], drivers: [driverPart(12, 'INV-GD-TTL')], diodes: [] });
    expect(d.driverNeeded).toBe(false);
    expect(d.driverNeededNote).toBeNull();
    expect(d.driver).toEqual([]);
    expect(d.requiredGateDriveV).toBe(2.5);
    expect(d.cautions.join(' ')).toMatch(/avalanches the switch/); // docs/engineering.md §8: no diode offered
  });
});

describe('diode ranking under 20 kHz PWM', () => {
  it('prefers the Schottky and fails the general-purpose rectifier', () => {
    const ranked = rankDiodeCandidates(caseM1(), [
      diodePart(21, 'INV-GP1', { kind: 'general', trrNs: 2000, vfV: 1 }),
      diodePart(22, 'INV-SD40'),
      diodePart(23, 'INV-SD04', { vrrmV: 4 }),
    ]);
    expect(ranked.map((r) => [r.mpn, r.verdict])).toEqual([
      ['INV-SD40', 'pass'],
      ['INV-SD04', 'marginal'], // 3.3 V within VRRM 4 V but above 0.8·4 V (practice)
      ['INV-GP1', 'fail'], // docs/engineering.md §8: t_rr 2 µs > 1 % of 50 µs
    ]);
  });
});

describe('sustained stall (docs/engineering.md §6)', () => {
  it('without stall protection, the small parts that pass at a 1 A limit fail stall-thermal', () => {
    const [r] = rankSwitchCandidates(caseM1Raw(), [logicLevel]);
    const check = r.checks.find((x) => x.id === 'stall-thermal');
    expect(check?.ok).toBe(false); // §6.1: 2.24 A steady through 80 mΩ behind 250 K/W
    expect(r.verdict).toBe('fail');
    expect(check?.note).toMatch(/stall protection/);
  });
});
