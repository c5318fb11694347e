import { describe, expect, it } from 'vitest';
import { checkDriver, driverInputThresholdsV, type DriverCheckInput } from '../../src/lib/driver-checks.ts';
import { driverPart } from './fixtures.ts';

/** 3.3 V LVTTL output levels: VOH min 2.4 V, VOL max 0.4 V [JEDEC JESD8C, from memory]. */
const LVTTL_OUT = { highV: 2.4, lowV: 0.4, railV: 3.3 };

function input(params: Parameters<typeof driverPart>[2], overrides: Partial<DriverCheckInput> = {}): DriverCheckInput {
  return {
    driver: driverPart(1, 'INV-GD1', params).params,
    supply: { minV: 10.8, maxV: 13.2 },
    logic: LVTTL_OUT,
    requiredGateV: 4.5,
    vgsMaxV: 20,
    switchingChargeNc: 3,
    pwmHz: 20000,
    ...overrides,
  };
}
const byId = (checks: ReturnType<typeof checkDriver>, id: string) => checks.find((c) => c.id === id);

describe('input thresholds', () => {
  it.each([
    ['fixed (TTL-compatible)', { inputLogic: 'fixed', inputHighMin: 2.0, inputLowMax: 0.8 }, 12, 2.0, 0.8], // JEDEC JESD8C LVTTL VIH/VIL [mem]
    ['CMOS ratio on 5 V', { inputLogic: 'ratio', inputHighMin: 0.7, inputLowMax: 0.3 }, 5, 3.5, 1.5], // docs/engineering.md §7: VIH = 0.7·VDD
    ['CMOS ratio on 12 V', { inputLogic: 'ratio', inputHighMin: 0.7, inputLowMax: 0.3 }, 12, 8.4, 3.6], // docs/engineering.md §7
    ['input-rail translator', { inputLogic: 'input-rail', inputHighMin: 0.7, inputLowMax: 0.3 }, 12, 2.31, 0.99], // 0.7·3.3 V logic rail
  ] as const)('%s', (_name, params, supplyV, vih, vil) => {
    const t = driverInputThresholdsV(driverPart(1, 'INV-GD1', params).params, supplyV, 3.3);
    expect(t.highMinV).toBeCloseTo(vih, 12);
    expect(t.lowMaxV).toBeCloseTo(vil, 12);
  });
});

describe('driver checks', () => {
  it('a TTL-input gate driver on 12 V accepts 3.3 V logic and drives a 4.5 V-spec gate', () => {
    const checks = checkDriver(input({}));
    expect(checks.every((c) => c.ok)).toBe(true); // JESD8C LVTTL levels vs fixed 2.0/0.8 V thresholds
    expect(byId(checks, 'output-high')?.value).toBeCloseTo(10.8 - 0.1, 12); // supply min − drop (docs/engineering.md §7)
  });

  it('a CMOS-ratio input on a 5 V supply does not accept 3.3 V logic', () => {
    const checks = checkDriver(input({ inputLogic: 'ratio', inputHighMin: 0.7, inputLowMax: 0.3 }, { supply: { minV: 4.75, maxV: 5.25 } }));
    expect(byId(checks, 'input-high')?.ok).toBe(false); // docs/engineering.md §7: 0.7·5 V = 3.5 V > 3.3 V logic
  });

  // 13.2 V unloaded output against a 12 V VGS(max)
  it('output above VGS(max) fails the gate rating', () => {
    expect(byId(checkDriver(input({}, { vgsMaxV: 12 })), 'gate-voltage-rating')?.ok).toBe(false); // docs/engineering.md §7: VOH ≤ VGS(max)
  });

  it('edges t ≈ Q_sw/I and duty error Δt·f', () => {
    const checks = checkDriver(input({ sourceCurrentA: 0.5, sinkCurrentA: 1, propagationDelayNs: 100 }));
    expect(byId(checks, 'switching-edges')?.value).toBeCloseTo(3e-9 / 0.5 + 3e-9 / 1, 15); // docs/engineering.md §7
    expect(byId(checks, 'duty-error')?.value).toBeCloseTo(100e-9 * 20000, 15); // docs/engineering.md §7: Δt·f
  });

  it('slow propagation under fast PWM is a margin issue', () => {
    const c = byId(checkDriver(input({ propagationDelayNs: 1000 }, { pwmHz: 50000 })), 'duty-error');
    expect(c?.ok).toBe(false); // 5 % duty error > 1 % (judgement)
    expect(c?.severity).toBe('margin');
  });

  it.each([
    [false, /Non-inverting/],
    [true, /Inverting/], // docs/engineering.md §7 polarity trap
  ])('reports polarity (inverting %s)', (inverting, text) => {
    expect(byId(checkDriver(input({ inverting })), 'polarity')?.note).toMatch(text);
  });

  it('supply outside the driver range fails', () => {
    // docs/engineering.md §7: the driver must run inside its rated supply range (10 V minimum for this invented part)
    expect(byId(checkDriver(input({ supplyMinV: 10 }, { supply: { minV: 4.5, maxV: 5.5 } })), 'driver-supply')?.ok).toBe(false);
  });
});
