import { describe, expect, it } from 'vitest';
import { avalancheEnergyJ, avalanchePowerW, checkDiode, drainSpikeV, type DiodeCheckInput } from '../../src/lib/diode-checks.ts';
import { diodePart } from './fixtures.ts';

function input(params: Parameters<typeof diodePart>[2], overrides: Partial<DiodeCheckInput> = {}): DiodeCheckInput {
  return {
    diode: diodePart(1, 'INV-D1', params).params,
    supplyMaxV: 12,
    meanCurrentA: 0.4,
    peakCurrentA: 3,
    pwmHz: 20000,
    voltageDerating: 0.8,
    ...overrides,
  };
}
const check = (i: DiodeCheckInput, id: string) => checkDiode(i).find((c) => c.id === id);

describe('freewheel diode checks (docs/engineering.md §8)', () => {
  it.each([
    // params, id, ok, severity — source
    [{ vrrmV: 20 }, 'reverse-voltage', true, undefined], // 12 ≤ 0.8·20 (derating 0.8 practice)
    [{ vrrmV: 14 }, 'reverse-voltage', false, 'margin'], // 12 ≤ 14 but > 11.2 (derated band)
    [{ vrrmV: 10 }, 'reverse-voltage', false, 'hard'], // above VRRM
    [{ ifAvA: 0.3 }, 'mean-current', false, 'hard'], // (1−D)·I 0.4 A > IF(AV)
    [{ ifsmA: 2 }, 'peak-current', false, 'hard'], // turn-off current above even the surge rating
    [{ kind: 'general', trrNs: 2000 }, 'reverse-recovery', false, 'hard'], // 2 µs > 1 % of 50 µs (practice)
    [{ kind: 'ultrafast', trrNs: 35 }, 'reverse-recovery', true, undefined], // 35 ns < 500 ns (practice)
    [{ kind: 'schottky', trrNs: null }, 'reverse-recovery', true, undefined], // no stored charge
  ] as const)('%o → %s ok=%s', (params, id, ok, severity) => {
    const c = check(input(params), id);
    expect(c?.ok).toBe(ok);
    expect(c?.severity).toBe(severity);
  });

  it('a general-purpose rectifier is fine for on/off drive', () => {
    const c = check(input({ kind: 'general', trrNs: 2000 }, { pwmHz: null }), 'reverse-recovery');
    expect(c?.ok).toBe(true); // docs/engineering.md §8: µs-class t_rr fine for slow on/off
  });

  it('the t_rr limit is 1 % of the PWM period', () => {
    expect(check(input({ kind: 'fast', trrNs: 150 }), 'reverse-recovery')?.limit).toBeCloseTo((0.01 / 20000) * 1e9, 9); // practice
  });

  it('drain spike ≈ V + V_F + L·di/dt', () => {
    expect(drainSpikeV(12, 0.45, 20e-9, 3 / 100e-9)).toBeCloseTo(12 + 0.45 + 0.6, 12); // docs/engineering.md §8
  });
});

describe('no freewheel diode: avalanche energy ½·L·I² (docs/engineering.md §8)', () => {
  it('M1, 0.15 mH at 1.8 A → 0.243 mJ, 4.86 W at 20 kHz', () => {
    const energyJ = avalancheEnergyJ(0.15e-3, 1.8);
    // re-derived as the inductor's stored energy ∫ L·i di from 0 to I, by the trapezoid rule
    const steps = 1000;
    let integral = 0;
    for (let k = 0; k < steps; k += 1) integral += 0.15e-3 * ((k + 0.5) * (1.8 / steps)) * (1.8 / steps);
    expect(energyJ).toBeCloseTo(integral, 9);
    expect(energyJ * 1000).toBeCloseTo(0.243, 3); // docs/engineering.md §8 [calc]
    expect(avalanchePowerW(0.15e-3, 1.8, 20000)).toBeCloseTo(4.86, 2); // docs/engineering.md §8 [calc]
  });
});
