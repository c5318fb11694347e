import { describe, expect, it } from 'vitest';
import { motorModelFromDatasheet } from '../../src/lib/motor.ts';
import { meanMotorVoltageV, pwmCurrents, pwmOperatingPoint, rippleApproxA, rippleExactA, rippleMaxApproxA } from '../../src/lib/pwm.ts';

const M1 = { ratedVoltageV: 3, noLoadSpeedRpm: 12000, noLoadCurrentA: 0.2, stallCurrentA: 1.8, stallTorqueNm: 0.0033953 };
const R = 3 / 1.8; // docs/engineering.md §2 M1
const L = 0.15e-3; // docs/engineering.md §4 example

/** Independent ripple: simulate the steady-state RL waveform by iterating whole periods until it settles. */
function simulatedRippleA(v: number, duty: number, f: number): number {
  const tau = L / R;
  const onS = duty / f;
  const offS = (1 - duty) / f;
  let iLow = 0;
  let iHigh = 0;
  for (let k = 0; k < 10000; k += 1) {
    iHigh = v / R + (iLow - v / R) * Math.exp(-onS / tau); // on: rises toward V/R
    iLow = iHigh * Math.exp(-offS / tau); // off: decays through the diode (V_F = 0 as in the example)
  }
  return iHigh - iLow;
}

describe('ripple, M1 with 0.15 mH at 3 V, D = 0.5', () => {
  it.each([
    [1000, 1.786], // docs/engineering.md §4 example [calc]
    [5000, 0.908], // docs/engineering.md §4 example [calc]
    [20000, 0.2484], // docs/engineering.md §4 example [calc]
  ])('%d Hz → %d A', (f, expected) => {
    const exact = rippleExactA(3, R, L, 0.5, f);
    expect(exact).toBeCloseTo(simulatedRippleA(3, 0.5, f), 9); // re-derived by simulation
    expect(exact).toBeCloseTo(expected, 3);
  });

  it('approximation V·D(1−D)/(L·f) is close when f·τe ≫ 1 and bounded by V/(4·L·f)', () => {
    const f = 200000; // f·τe = 18
    expect(rippleApproxA(3, L, 0.5, f)).toBeCloseTo(rippleExactA(3, R, L, 0.5, f), 3); // docs/engineering.md §4
    expect(rippleMaxApproxA(3, L, f)).toBeCloseTo(3 / (4 * L * f), 12); // docs/engineering.md §4
    expect(rippleApproxA(3, L, 0.3, f)).toBeLessThan(rippleMaxApproxA(3, L, f));
  });

  it('no ripple at 0 % or 100 % duty', () => {
    expect(rippleExactA(3, R, L, 1, 20000)).toBe(0); // continuous conduction, no switching
  });
});

describe('mean voltage and currents', () => {
  it.each([
    [3, 0.5, 0, 1.5], // docs/engineering.md §4: D·V − (1−D)·V_F
    [3, 0.5, 0.4, 1.3], // docs/engineering.md §4
    [12, 0.8, 0.7, 9.46], // docs/engineering.md §4
  ])('V %d, D %d, VF %d → %d V', (v, d, vf, expected) => {
    expect(meanMotorVoltageV(v, d, vf)).toBeCloseTo(expected, 12);
  });

  it('stalled at D = 0.5: mean 0.9 A, diode 0.45 A', () => {
    const p = pwmOperatingPoint(motorModelFromDatasheet(M1), 3, 0.5, 0, { kind: 'stall-only' });
    expect(p.currentA).toBeCloseTo(0.9, 9); // docs/engineering.md §4 example [calc]: 1.5 V / R
    const c = pwmCurrents(p.currentA, 0.5);
    expect(c.diodeMeanA).toBeCloseTo(0.45, 9); // docs/engineering.md §4 example [calc]
    expect(c.supplyMeanA).toBeCloseTo(0.45, 9); // D·I (docs/engineering.md §4)
  });

  it('switch RMS includes ripple: I_rms² = D·(I² + ΔI²/12)', () => {
    expect(pwmCurrents(1, 0.5, 0.6).switchRmsA).toBeCloseTo(Math.sqrt(0.5 * (1 + 0.36 / 12)), 12); // docs/engineering.md §4
  });

  it('torque load at the mean voltage runs at the model current I0 + T/Kt', () => {
    const model = motorModelFromDatasheet(M1);
    const p = pwmOperatingPoint(model, 3, 0.8, 0.3, { kind: 'torque', torqueNm: 0.5e-3 });
    expect(p.currentA).toBeCloseTo(0.2 + 0.5e-3 / model.ktNmPerA, 12); // docs/engineering.md §2
  });
});
