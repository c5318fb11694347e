import { describe, expect, it } from 'vitest';
import { evaluateSwitch, type SwitchEvaluationInput } from '../../src/lib/switch-evaluation.ts';
import { SWITCH_BODY } from '../helpers/contract-examples.ts';

/** api-contract.md /api/calc/switch request example (invented part). */
function contractExample(): SwitchEvaluationInput {
  return structuredClone(SWITCH_BODY) as SwitchEvaluationInput;
}

type Patch = { mosfet?: Partial<SwitchEvaluationInput['mosfet']>; operating?: Partial<SwitchEvaluationInput['operating']> };
/**
 * The contract example with a 1 A stall current limit, so each row below isolates one failure (without any
 * protection the example's jam at 3 A fails stall-thermal: see the first describe).
 */
function withPatch(p: Patch): SwitchEvaluationInput {
  const base = contractExample();
  return {
    ...base,
    mosfet: { ...base.mosfet, ...p.mosfet },
    operating: { ...base.operating, stallProtection: { kind: 'current-limit', limitA: 1 }, ...p.operating },
  };
}

describe('contract example', () => {
  const r = evaluateSwitch(contractExample());
  it('carries the contract fields and check ids, and fails only the sustained-stall check', () => {
    for (const id of [
      'drain-voltage',
      'gate-voltage-rating',
      'gate-drive',
      'stall-current',
      'running-current',
      'junction-temperature',
      'stall-thermal',
    ]) {
      expect(r.checks.map((c) => c.id)).toContain(id); // api-contract.md: required check ids (stall-thermal from "Extensions")
    }
    // api-contract.md "Extensions": absent stall protection = a jam judged as a steady state at stallCurrentA (3 A)
    expect(r.checks.filter((c) => !c.ok).map((c) => c.id)).toEqual(['stall-thermal']);
    expect(r.verdict).toBe('fail');
  });

  it('re-derives the jam junction by fixed-point iteration (a second method beside the closed form)', () => {
    const rds = 0.05 * Math.pow(0.035 / 0.05, 0.5 / 5.5); // log-space interpolation at 5 V (docs/engineering.md §5.3)
    let tj = 40;
    for (let k = 0; k < 20000; k += 1) tj = 40 + 250 * 9 * rds * (1 + 0.005 * (tj - 25)); // Tj = TA + Rθ·I²·RDS(Tj)
    expect(r.stallJunctionC).toBeCloseTo(tj, 6);
    expect(tj).toBeGreaterThan(290); // about 297 °C: far above Tj,max 150 °C
  });

  it('passes once a 1 A current limit holds the jam', () => {
    expect(evaluateSwitch(withPatch({})).verdict).toBe('pass');
  });

  it('re-derives losses and junction independently', () => {
    const rds = 0.05 * Math.pow(0.035 / 0.05, 0.5 / 5.5); // log-space interpolation at 5 V (docs/engineering.md §5)
    expect(r.rdsOnAtDriveOhms).toBeCloseTo(rds, 12);
    const qsw = 2 + 1.5 / 2; // Q_sw ≈ Q_gd + Q_gs/2 (docs/engineering.md §5)
    const tOn = (qsw * 1e-9) / 0.02; // capped at 20 mA both ways (docs/engineering.md §5)
    const psw = 0.5 * 5.5 * 0.8 * 2 * tOn * 20000; // ½·(V + V_F)·I·(t_r + t_f)·f
    expect(r.switchingLossW).toBeCloseTo(psw, 12);
    // fixed-point iteration of Tj = TA + Rθ·(D·I²·RDS(Tj) + P_sw), independent of the closed form
    let tj = 40;
    for (let k = 0; k < 5000; k += 1) tj = 40 + 250 * (0.6 * 0.64 * rds * (1 + 0.005 * (tj - 25)) + psw);
    expect(r.junctionC).toBeCloseTo(tj, 8);
    expect(r.gateDrivePowerW).toBeCloseTo(6e-9 * 5 * 20000, 15); // Qg·V·f (docs/engineering.md §5)
  });
});

describe.each([
  // name, patch, failing check id, expected verdict, source
  ['gate drive below the lowest spec VGS', { operating: { gateDriveV: 3.3 } }, 'gate-drive', 'fail'], // docs/engineering.md §5
  ['drain voltage within the derated band', { operating: { supplyMaxV: 24.5 } }, 'drain-voltage', 'marginal'], // docs/engineering.md §5, derating 0.8 practice
  ['drain voltage above the rating', { operating: { supplyMaxV: 30 } }, 'drain-voltage', 'fail'], // docs/engineering.md §5
  ['gate drive above VGS(max)', { operating: { gateDriveV: 12 }, mosfet: { vgsMaxV: 8 } }, 'gate-voltage-rating', 'fail'], // docs/engineering.md §5
  ['stall current above IDM', { operating: { stallCurrentA: 25 } }, 'stall-current', 'fail'], // docs/engineering.md §5
  ['running current above ID(TA)', { operating: { runningCurrentA: 2.5, pwmHz: undefined, duty: undefined } }, 'running-current', 'fail'], // docs/engineering.md §5
  [
    'junction between Tj,max − margin and Tj,max',
    { operating: { runningCurrentA: 1.6, pwmHz: undefined, duty: undefined, ambientC: 80 } },
    'junction-temperature',
    'marginal',
  ], // docs/engineering.md §5, 25 K practice
  ['slow edges from a weak pin under PWM', { operating: { gateDriveCurrentA: 0.0002 } }, 'switching-edges', 'fail'], // docs/engineering.md §5: flag slow edges
  ['P-channel on the low side', { mosfet: { channel: 'p' as const } }, 'channel', 'fail'], // low side needs N-channel
  // docs/engineering.md §5.4: below the plateau the channel cannot carry the current, in on/off drive too
  [
    'on/off drive below the Miller plateau',
    {
      mosfet: {
        rdsOn: [
          { vgsV: 2.5, ohms: 0.08 },
          { vgsV: 4.5, ohms: 0.05 },
        ],
      },
      operating: { gateDriveV: 2.55, pwmHz: undefined, duty: undefined },
    },
    'miller-plateau',
    'fail',
  ],
  // docs/engineering.md §5.5 [judgement]: 3 V is within 1 V of VGS(th) max 2.5 V; the 2.5 V line measured at 0.3 A, worst case 1 A (the limit) > 2 × 0.3 A
  [
    'worst current far above the RDS(on) test current near threshold',
    {
      mosfet: {
        vPlateauV: 2.7,
        rdsOn: [
          { vgsV: 2.5, ohms: 0.08, testCurrentA: 0.3 },
          { vgsV: 4.5, ohms: 0.05 },
        ],
      },
      operating: { gateDriveV: 3, gateDriveCurrentA: 0.2 },
    },
    'rdson-test-current',
    'marginal',
  ],
] as const)('%s', (_name, patch, id, verdict) => {
  it(`${id} fails and the verdict is ${verdict}`, () => {
    const r = evaluateSwitch(withPatch(patch as Patch));
    const check = r.checks.find((c) => c.id === id);
    expect(check?.ok).toBe(false);
    expect(check?.severity).toBe(verdict === 'fail' ? 'hard' : 'margin');
    expect(check?.note.length).toBeGreaterThan(20);
    expect(r.verdict).toBe(verdict);
  });
});

describe('actionable notes', () => {
  it('a part specified only at 10 V on a 3.3 V logic high asks for a driver or a 2.5 V part', () => {
    const r = evaluateSwitch(withPatch({ mosfet: { rdsOn: [{ vgsV: 10, ohms: 0.03 }], vgsThMaxV: 3 }, operating: { gateDriveV: 3.3 } }));
    const note = r.checks.find((c) => c.id === 'gate-drive')?.note ?? '';
    expect(note).toMatch(/only specified at 10 V/); // docs/engineering.md §5: not characterised below the lowest spec point
    expect(note).toMatch(/gate driver/);
    expect(note).toMatch(/10 V rail/);
    expect(r.rdsOnAtDriveOhms).toBeNull();
    expect(r.junctionC).toBeNull();
  });

  it('common practice: VGS(th) up to 4 V is not reliably switched by 3.3 V', () => {
    const r = evaluateSwitch(
      withPatch({
        mosfet: {
          vgsThMaxV: 4,
          rdsOn: [
            { vgsV: 2.5, ohms: 0.1 },
            { vgsV: 4.5, ohms: 0.05 },
          ],
        },
        operating: { gateDriveV: 3.3 },
      }),
    );
    const check = r.checks.find((c) => c.id === 'gate-drive');
    expect(check?.ok).toBe(false); // common practice: drive below VGS(th) max fails even with a low spec point on record
    expect(check?.note).toMatch(/VGS\(th\) max of 4 V/);
  });

  it('reports thermal runaway as a hard junction failure', () => {
    const r = evaluateSwitch(withPatch({ operating: { runningCurrentA: 6, pwmHz: undefined, duty: undefined } }));
    expect(r.junctionC).toBeNull(); // k·α ≥ 1 → no steady state (docs/engineering.md §5)
    expect(r.checks.find((c) => c.id === 'junction-temperature')?.severity).toBe('hard');
  });

  it('on/off drive has no switching or gate-drive power', () => {
    const r = evaluateSwitch(withPatch({ operating: { pwmHz: undefined, duty: undefined } }));
    expect(r.switchingLossW).toBe(0);
    expect(r.gateDrivePowerW).toBe(0);
  });
});
