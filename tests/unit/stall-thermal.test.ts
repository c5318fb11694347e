/**
 * Sustained stall (docs/engineering.md §6): a jammed shaft judged as a steady state, at a current limit, or as a
 * transient cut off after a time with single-pulse Zth points. Expected junctions come from the worked examples of
 * §6.6, re-derived here by fixed-point iteration of Tj = TA + Rθ·I²·RDS25·(1 + α·(Tj − 25)) — a second method
 * beside the engine's closed form.
 */
import { describe, expect, it } from 'vitest';
import { evaluateSwitch, type SwitchEvaluationInput, type SwitchStallProtection } from '../../src/lib/switch-evaluation.ts';
import { zthAtPulseCPerW } from '../../src/lib/thermal.ts';

const ZTH_A = [
  { pulseS: 1e-3, zthCPerW: 1.5 },
  { pulseS: 1e-2, zthCPerW: 6 },
  { pulseS: 0.1, zthCPerW: 25 },
  { pulseS: 1, zthCPerW: 70 },
  { pulseS: 10, zthCPerW: 150 },
  { pulseS: 100, zthCPerW: 230 },
]; // invented single-pulse curve of §6.6 switch A

/** Fixed-point Tj for a heat loop; null when it diverges (runaway). */
function fixedPointTj(ambientC: number, rthCPerW: number, currentA: number, rds25Ohm: number, alpha = 0.005): number | null {
  let tj = ambientC;
  for (let i = 0; i < 100_000; i += 1) {
    const next = ambientC + rthCPerW * currentA ** 2 * rds25Ohm * (1 + alpha * (tj - 25));
    if (!Number.isFinite(next) || next > 1e6) return null;
    if (Math.abs(next - tj) < 1e-10) return next;
    tj = next;
  }
  return null;
}

function jam(part: 'A' | 'B', protection: SwitchStallProtection, withZth = true): SwitchEvaluationInput {
  const a = part === 'A';
  return {
    mosfet: {
      vdsMaxV: 40,
      vgsMaxV: 20,
      vgsThMaxV: 2.5,
      idPulsedA: 40,
      tjMaxC: 150,
      rthJaCPerW: a ? 250 : 60,
      qgTotalNc: 10,
      vPlateauV: 3.5,
      rdsOn: [{ vgsV: 4.5, ohms: a ? 0.05 : 0.02 }],
      zthPoints: a && withZth ? ZTH_A : [],
    },
    // §6.6 "12 V case": Is,max = 12.6 V / 2.211 Ω (cold winding) = 5.698 A, on/off, TA 40 °C
    operating: {
      supplyMaxV: 12.6,
      runningCurrentA: 0.7,
      stallCurrentA: 12.6 / 2.211,
      gateDriveV: 10,
      gateDriveCurrentA: 1,
      ambientC: 40,
      diodeForwardV: 0.5,
      stallProtection: protection,
    },
  };
}

describe.each([
  // name, part, protection, Zth on record, effective Rθ (K/W), jam current (A), expected (docs/engineering.md §6.6 table)
  ['no protection, small part: runaway', 'A', { kind: 'none' }, true, 250, 12.6 / 2.211, 'fail'],
  ['no protection, large part: about 92 °C', 'B', { kind: 'none' }, true, 60, 12.6 / 2.211, 'ok'],
  ['current limit 1.5 A: about 75 °C', 'A', { kind: 'current-limit', limitA: 1.5 }, true, 250, 1.5, 'ok'],
  ['cut-off after 0.1 s: Zth 25 K/W, about 95 °C', 'A', { kind: 'cut-off', afterS: 0.1 }, true, 25, 12.6 / 2.211, 'ok'],
  [
    'cut-off after 0.5 s: Zth 51.3 K/W, about 194 °C',
    'A',
    { kind: 'cut-off', afterS: 0.5 },
    true,
    25 * Math.pow(70 / 25, Math.log10(5)),
    12.6 / 2.211,
    'fail',
  ],
  ['cut-off after 300 s: beyond the curve, RθJA, runaway', 'A', { kind: 'cut-off', afterS: 300 }, true, 250, 12.6 / 2.211, 'fail'],
  ['cut-off without a Zth curve: judged as a steady state', 'A', { kind: 'cut-off', afterS: 0.1 }, false, 250, 12.6 / 2.211, 'fail'],
] as const)('%s', (_name, part, protection, withZth, rthCPerW, currentA, expected) => {
  it(`stall-thermal is ${expected}, at the junction the fixed point gives`, () => {
    const r = evaluateSwitch(jam(part, protection as SwitchStallProtection, withZth));
    const check = r.checks.find((c) => c.id === 'stall-thermal');
    const tj = fixedPointTj(40, rthCPerW, currentA, part === 'A' ? 0.05 : 0.02);
    expect(check?.ok).toBe(expected === 'ok');
    expect(check?.limit).toBe(150); // a jam is a fault case: judged against Tj,max itself (§6)
    if (tj == null) expect(r.stallJunctionC).toBeNull();
    else expect(r.stallJunctionC).toBeCloseTo(tj, 6);
    if (expected === 'fail') expect(check?.severity).toBe('hard');
    if (protection.kind === 'cut-off' && !withZth) expect(check?.note).toMatch(/no Zth curve/);
  });
});

describe('§6.6 reference junctions, as printed', () => {
  it.each([
    ['B, no protection', 60, 12.6 / 2.211, 0.02, 92.01],
    ['A, 1.5 A limit', 250, 1.5, 0.05, 75.18],
    ['A, 0.1 s cut-off', 25, 12.6 / 2.211, 0.05, 94.73],
    ['A, 0.5 s cut-off', 25 * Math.pow(70 / 25, Math.log10(5)), 12.6 / 2.211, 0.05, 193.6],
  ])('%s → %s °C', (_n, rth, current, rds, printedC) => {
    expect(fixedPointTj(40, rth, current, rds)).toBeCloseTo(printedC, printedC > 100 ? 0 : 1);
  });
});

describe('single-pulse Zth interpolation (docs/engineering.md §6.4)', () => {
  it.each([
    ['below the first point: its value', 0.5e-3, 1.5],
    ['on a point', 0.1, 25],
    ['between points, log–log', 0.5, 25 * Math.pow(70 / 25, Math.log10(5))], // ln Z linear in ln t
    ['between points, 0.2 s', 0.2, 25 * Math.pow(70 / 25, Math.log10(2))],
    ['beyond the last point: RθJA', 300, 250],
  ])('%s', (_n, pulseS, expected) => {
    expect(zthAtPulseCPerW(ZTH_A, pulseS, 250)).toBeCloseTo(expected, 9);
  });
  it('never above RθJA, and RθJA without points', () => {
    expect(zthAtPulseCPerW([{ pulseS: 1, zthCPerW: 400 }], 0.5, 250)).toBe(250);
    expect(zthAtPulseCPerW([], 0.5, 250)).toBe(250);
  });
});

describe('a jam under PWM (docs/engineering.md §6.2)', () => {
  it('uses Is,pwm = (D·V − (1 − D)·VF)/R at the jam duty and I_rms = Is,pwm·√D', () => {
    const body = jam('B', { kind: 'none' });
    const r = evaluateSwitch({ ...body, operating: { ...body.operating, pwmHz: 20000, duty: 0.5, stallDuty: 0.8 } });
    const isPwm = (0.8 * 12.6 - 0.2 * 0.5) / 2.211; // §6.6: 4.513 A
    expect(isPwm).toBeCloseTo(4.513, 2);
    expect(r.stallCurrentRmsA).toBeCloseTo(isPwm * Math.sqrt(0.8), 9);
  });
});
