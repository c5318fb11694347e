import { describe, expect, it } from 'vitest';
import { gateDrivePowerW, switchingChargeNc, switchingLossW, switchingTimes } from '../../src/lib/switching.ts';

describe('switching loss, docs/engineering.md §5 example', () => {
  // Q_sw 3 nC, V_drv 3.3 V, V_plateau 2.2 V, R 52 Ω, V + V_F = 3.5 V, 1 A, 20 kHz
  const t = switchingTimes({ switchingChargeNc: 3, driveV: 3.3, plateauV: 2.2, gateResistanceOhm: 52, sourceLimitA: 1, sinkLimitA: 1 });

  it.each([
    ['turnOnS', t.turnOnS, 3e-9 / ((3.3 - 2.2) / 52), 141.8e-9], // docs/engineering.md §5 [calc]; re-derived t = Q·R/(V_drv − V_pl)
    ['turnOffS', t.turnOffS, 3e-9 / (2.2 / 52), 70.9e-9], // docs/engineering.md §5 [calc]; re-derived t = Q·R/V_pl
  ] as const)('%s', (_name, actual, rederived, quoted) => {
    expect(actual).toBeCloseTo(rederived, 15);
    expect(actual * 1e9).toBeCloseTo(quoted * 1e9, 1);
  });

  it('P ≈ 7.45 mW', () => {
    const p = switchingLossW(3.5, 1, t.turnOnS, t.turnOffS, 20000);
    // re-derived as energy per edge (½·V·I·t) times edges per second
    expect(p).toBeCloseTo((0.5 * 3.5 * 1 * t.turnOnS + 0.5 * 3.5 * 1 * t.turnOffS) * 20000, 15);
    expect(p * 1000).toBeCloseTo(7.45, 2); // docs/engineering.md §5 example [calc]
  });
});

describe('gate current limits and charge', () => {
  it('caps the gate current at the driver rating', () => {
    const t = switchingTimes({
      switchingChargeNc: 3,
      driveV: 3.3,
      plateauV: 2.2,
      gateResistanceOhm: 0,
      sourceLimitA: 0.004,
      sinkLimitA: 0.008,
    });
    expect(t.turnOnS).toBeCloseTo(3e-9 / 0.004, 15); // docs/engineering.md §5/§5: t ≈ Q_sw/I
    expect(t.turnOffS).toBeCloseTo(3e-9 / 0.008, 15); // docs/engineering.md §7
  });

  it('never finishes turning on when the drive does not reach the plateau', () => {
    const t = switchingTimes({ switchingChargeNc: 3, driveV: 2, plateauV: 2.2, gateResistanceOhm: 10, sourceLimitA: 1, sinkLimitA: 1 });
    expect(t.turnOnS).toBe(Infinity);
  });

  it.each([
    [6, 2, 1.5, 2.75], // docs/engineering.md §5: Q_gd + Q_gs/2
    [6, null, null, 6], // no split: total gate charge (conservative)
  ])('Qg %d, Qgd %d, Qgs %d → Q_sw %d nC', (qg, qgd, qgs, expected) => {
    expect(switchingChargeNc(qg, qgd, qgs)).toBeCloseTo(expected, 12);
  });

  it('gate-drive power Qg·V·f', () => {
    expect(gateDrivePowerW(10, 5, 20000)).toBeCloseTo(10e-9 * 5 * 20000, 15); // docs/engineering.md §5
  });
});
