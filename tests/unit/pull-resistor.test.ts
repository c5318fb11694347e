import { describe, expect, it } from 'vitest';
import { pullNodeVoltageV, sizePullResistor, type PullResistorRequest } from '../../src/lib/pull-resistor.ts';

function pullDown(internalOhms: number, limitV = 0.5): PullResistorRequest {
  return {
    pin: { internalPull: 'up', internalPullOhms: internalOhms, railV: 3.3, maxCurrentA: 0.004 },
    external: { to: 'down', railV: 0 }, node: { mustBe: 'low', limitV }, series: 'E12',
  };
}

describe('domain.md §6 examples', () => {
  it.each([
    // request, raw maximum (re-derived), chosen, node V (domain.md §6 [calc])
    ['40 kΩ up, pull-down, ≤ 0.5 V', pullDown(40000), (40000 * 0.5) / 2.8, 6800, 0.4795],
    ['20 kΩ up, pull-down, ≤ 0.5 V', pullDown(20000), (20000 * 0.5) / 2.8, 3300, 0.467],
    [
      '40 kΩ down, pull-up to 3.3 V, ≥ 2.0 V',
      { pin: { internalPull: 'down', internalPullOhms: 40000, railV: 3.3, maxCurrentA: 0.004 }, external: { to: 'up', railV: 3.3 }, node: { mustBe: 'high', limitV: 2.0 }, series: 'E12' } as PullResistorRequest,
      (40000 * 1.3) / 2.0,
      22000,
      2.129,
    ],
  ] as const)('%s', (_name, req, rawMax, chosen, nodeV) => {
    const r = sizePullResistor(req);
    expect(r.ok).toBe(true);
    expect(r.maxOhms).toBe(chosen); // IEC 60063 E12 round-down of rawMax
    expect(r.maxOhms as number).toBeLessThanOrEqual(rawMax);
    expect(r.chosenOhms).toBe(chosen);
    expect(r.nodeV).toBeCloseTo(nodeV, 3); // domain.md §6 [calc]
    expect(r.minOhms).toBe(1000); // 3.3 V / 4 mA = 825 Ω → E12 round-up 1 kΩ
    expect(r.activeCurrentA).toBeCloseTo(3.3 / chosen, 12); // |V_pin − V_ext|/R_ext (domain.md §6)
  });
});

describe('common practice: 4.7 kΩ pull-up to 5 V against a 40 kΩ internal pull-down', () => {
  it('holds a 5 V CMOS input (VIH 3.5 V) high at ≈ 4.47 V', () => {
    const nodeV = pullNodeVoltageV(0, 40000, 5, 4700);
    expect(nodeV).toBeCloseTo((5 * 40000) / 44700, 12); // divider, re-derived
    expect(nodeV).toBeCloseTo(4.47, 2); // common practice example
    expect(nodeV).toBeGreaterThanOrEqual(0.7 * 5); // CMOS VIH = 0.7·VDD (domain.md §5)
  });

  it('the pin sinks ≈ 1.06 mA driving low, inside 4 mA', () => {
    const currentA = 5 / 4700; // Ohm's law
    expect(currentA * 1000).toBeCloseTo(1.06, 2); // common practice example
    const r = sizePullResistor({
      pin: { internalPull: 'down', internalPullOhms: 40000, railV: 5, maxCurrentA: 0.004 },
      external: { to: 'up', railV: 5 }, node: { mustBe: 'high', limitV: 3.5 }, series: 'E12',
    });
    expect(r.minOhms as number).toBeLessThanOrEqual(4700); // 5 V / 4 mA = 1.25 kΩ → 1.5 kΩ
    expect(r.maxOhms as number).toBeGreaterThanOrEqual(4700); // 40 kΩ·1.5/3.5 = 17.1 kΩ → 15 kΩ
    expect(r.maxOhms).toBe(15000); // IEC 60063 E12 round-down
  });
});

describe('edge cases', () => {
  it('reports no fit when the pin cannot drive any value that holds the node', () => {
    const r = sizePullResistor({ ...pullDown(40000), pin: { ...pullDown(40000).pin, maxCurrentA: 0.0001 } });
    expect(r.ok).toBe(false); // 3.3 V / 0.1 mA = 33 kΩ min > 6.8 kΩ max
    expect(r.chosenOhms).toBeNull();
    expect(r.notes[0]).toMatch(/No E12 value fits/);
  });

  it('rejects a pull in the wrong direction', () => {
    const r = sizePullResistor({ ...pullDown(40000), external: { to: 'up', railV: 3.3 } });
    expect(r.ok).toBe(false);
  });

  it('no internal pull: any value holds, 100 kΩ practical ceiling', () => {
    const r = sizePullResistor({ ...pullDown(0), pin: { internalPull: 'none', internalPullOhms: 0, railV: 3.3, maxCurrentA: 0.004 } });
    expect(r.chosenOhms).toBe(100000); // common practice ceiling against leakage
    expect(r.nodeV).toBe(0);
  });

  it('warns when the pull-up rail is above the pin supply', () => {
    const r = sizePullResistor({
      pin: { internalPull: 'down', internalPullOhms: 40000, railV: 3.3, maxCurrentA: 0.004 },
      external: { to: 'up', railV: 5 }, node: { mustBe: 'high', limitV: 3.5 }, series: 'E24',
    });
    expect(r.notes.join(' ')).toMatch(/tolerant/); // domain.md §6
  });
});
