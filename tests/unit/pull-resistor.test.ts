import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { pullNodeVoltageV, sizePullResistor, type PullResistorRequest, worstPullCurrentA } from '../../src/lib/pull-resistor.ts';
import { calcPullResistorRequestSchema, parseCalcBody } from '../../src/lib/schemas/calc.ts';

// Formulas re-derived here from docs/engineering.md §power-on (and docs/engineering.md §9):
//   pull-down against a pull-up to V_pull: R_ext ≤ R_int·V_lim/(V_pull − V_lim)
//   pull-up to V_ext against a pull-down:  R_ext ≤ R_int·(V_ext − VIH)/VIH
//   with leakage I and tolerances:         R_ext ≤ R_i·d_ext/((d_int + I·R_i)·(1 + tol_ext)), R_i = R_int·(1 − tol_int)
// Standard values from the IEC 60063 E12 table, written out here:
const E12 = [10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82];

function pullDown(internalOhms: number, limitV = 0.5): PullResistorRequest {
  return {
    pin: { internalPull: 'up', internalPullOhms: internalOhms, railV: 3.3, maxCurrentA: 0.004 },
    external: { to: 'down', railV: 0 },
    node: { mustBe: 'low', limitV },
    series: 'E12',
  };
}

const pullUpAgainstDown: PullResistorRequest = {
  pin: { internalPull: 'down', internalPullOhms: 40000, railV: 3.3, maxCurrentA: 0.004 },
  external: { to: 'up', railV: 3.3 },
  node: { mustBe: 'high', limitV: 2.0 },
  series: 'E12',
};

describe('docs/engineering.md §9 examples (tolerances 0, leakage 0: the calculator as before)', () => {
  it.each([
    // request, raw maximum re-derived from the formula, the same as docs/engineering.md §power-on states it,
    // chosen (E12 round-down, IEC 60063), node V (docs/engineering.md §9 [calc])
    ['40 kΩ up, pull-down, ≤ 0.5 V', pullDown(40000), (40000 * 0.5) / (3.3 - 0.5), 7142.9, 6800, 0.4795],
    ['20 kΩ up, pull-down, ≤ 0.5 V', pullDown(20000), (20000 * 0.5) / (3.3 - 0.5), 3571.4, 3300, 0.467],
    ['40 kΩ down, pull-up to 3.3 V, ≥ 2.0 V', pullUpAgainstDown, (40000 * (3.3 - 2.0)) / 2.0, 26000, 22000, 2.129],
  ] as const)('%s', (_name, req, rawMax, statedMax, chosen, nodeV) => {
    const r = sizePullResistor(req);
    // The E12 value chosen lies below both the formula's maximum and the one the reference states.
    expect(r.maxOhms as number).toBeLessThanOrEqual(Math.min(rawMax, statedMax));
    expect(r.ok).toBe(true);
    expect(r.maxOhms).toBe(chosen); // IEC 60063 E12 round-down of rawMax
    expect(r.maxOhms as number).toBeLessThanOrEqual(rawMax);
    expect(r.chosenOhms).toBe(chosen);
    expect(r.nodeV).toBeCloseTo(nodeV, 3); // docs/engineering.md §9 [calc]
    expect(r.minOhms).toBe(1000); // 3.3 V / 4 mA = 825 Ω → E12 round-up 1 kΩ
    expect(r.activeCurrentA).toBeCloseTo(3.3 / chosen, 12); // |V_pin − V_ext|/R_ext (docs/engineering.md §9)
  });
});

const withPin = (
  req: PullResistorRequest,
  pin: Partial<PullResistorRequest['pin']>,
  rest: Partial<PullResistorRequest> = {},
): PullResistorRequest => ({ ...req, ...rest, pin: { ...req.pin, ...pin } });
const noPull = (leakageA: number, rest: Partial<PullResistorRequest> = {}): PullResistorRequest =>
  withPin(
    pullDown(0),
    { internalPull: 'none', internalPullOhms: 0, leakageA },
    { external: { to: 'down', railV: 0, tolerance: 0.01 }, ...rest },
  );

describe('tolerances, leakage and the ceiling (docs/engineering.md §9; docs/engineering.md §power-on), values derived by hand', () => {
  it.each([
    {
      name: '40 kΩ ±30 % up, 1 % resistor, 1 µA: R_i = 28 kΩ, bound 28k·0.5/((2.8 + 0.028)·1.01) = 4901 Ω → 4.7 kΩ',
      req: withPin(
        pullDown(40000),
        { internalPullTolerance: 0.3, leakageA: 1e-6 },
        { external: { to: 'down', railV: 0, tolerance: 0.01 } },
      ),
      chosen: 4700,
      minOhms: 1000, // 3.3/(4 mA·0.99) = 833 Ω → 1 kΩ
      // worst corner R_i 28 kΩ, R_e 4747 Ω: divider + I·(R_i‖R_e)
      nodeV: (3.3 * 4747) / (28000 + 4747) + (1e-6 * 28000 * 4747) / (28000 + 4747), // 0.4824 V
      currentA: 3.3 / (4700 * 0.99),
    },
    {
      name: '40 kΩ ±30 % down, pull-up 1 %, VIH 2.0, 1 µA: bound 28k·1.3/((2.0 + 0.028)·1.01) = 17 771 Ω → 15 kΩ',
      req: withPin(
        pullUpAgainstDown,
        { internalPullTolerance: 0.3, leakageA: 1e-6 },
        { external: { to: 'up', railV: 3.3, tolerance: 0.01 } },
      ),
      chosen: 15000,
      minOhms: 1000,
      nodeV: (3.3 * 28000) / (28000 + 15150) - (1e-6 * 28000 * 15150) / (28000 + 15150), // 2.1315 V
      currentA: 3.3 / (15000 * 0.99),
    },
    {
      name: 'no internal pull, 1 µA, 1 %: bound 0.5 V/(1 µA·1.01) = 495 kΩ → 470 kΩ',
      req: noPull(1e-6),
      chosen: 470000,
      minOhms: 1000,
      nodeV: 1e-6 * 470000 * 1.01,
      currentA: 3.3 / (470000 * 0.99),
    },
    {
      name: 'no internal pull, no leakage: unbounded, so the 1 MΩ ceiling (an E12 value) is the answer',
      req: noPull(0),
      chosen: 1_000_000,
      minOhms: 1000,
      nodeV: 0,
      currentA: 3.3 / (1e6 * 0.99),
    },
    {
      name: '1 pA leakage would allow 0.5/(1e-12·1.01) ≈ 495 GΩ: the ceiling caps it at 1 MΩ',
      req: noPull(1e-12),
      chosen: 1_000_000,
      minOhms: 1000,
      nodeV: 1e-12 * 1.01e6,
      currentA: 3.3 / (1e6 * 0.99),
    },
    {
      name: 'a 250 kΩ ceiling rounds down to E12 220 kΩ',
      req: noPull(0, { ceilingOhms: 250_000 }),
      chosen: 220_000,
      minOhms: 1000,
      nodeV: 0,
      currentA: 3.3 / (220000 * 0.99),
    },
    {
      name: 'a 250 kΩ ceiling in E24 gives 240 kΩ',
      req: noPull(0, { ceilingOhms: 250_000, series: 'E24' }),
      chosen: 240_000,
      minOhms: 910,
      nodeV: 0,
      currentA: 3.3 / (240000 * 0.99), // 833 Ω → IEC 60063 E24 round-up 910 Ω
    },
    {
      // Helping pull-down 40 kΩ ±30 %, 20 µA leakage: at R_i = 52 kΩ, d_int + I·R_i = −0.5 + 1.04 = 0.54 → 52k·0.5/0.54 = 48.1 kΩ;
      // at 28 kΩ: −0.5 + 0.56 = 0.06 → 233 kΩ. The weak end of a helping pull is the worst: 47 kΩ.
      name: 'a helping internal pull with heavy leakage is worst at +tol: 47 kΩ',
      req: withPin(pullDown(40000), { internalPull: 'down', internalPullTolerance: 0.3, leakageA: 20e-6 }),
      chosen: 47000,
      minOhms: 1000,
      nodeV: (20e-6 * 52000 * 47000) / 99000,
      currentA: 3.3 / 47000,
    },
  ])('$name', ({ req, chosen, minOhms, nodeV, currentA }) => {
    const r = sizePullResistor(req);
    expect(r.ok).toBe(true);
    expect(r.chosenOhms).toBe(chosen);
    expect(r.maxOhms).toBe(chosen);
    expect(r.minOhms).toBe(minOhms);
    expect(r.nodeV as number).toBeCloseTo(nodeV, 4);
    expect(r.activeCurrentA as number).toBeCloseTo(currentA, 9);
    expect(r.notes[0]).toMatch(/node sits at/);
  });

  it('says when the ceiling capped the answer', () => {
    expect(sizePullResistor(noPull(0)).notes.join(' ')).toMatch(/ceiling of 1000 kΩ/);
    expect(sizePullResistor(noPull(1e-6)).notes.join(' ')).not.toMatch(/ceiling/); // 470 kΩ came from leakage, not the cap
  });

  it('pin-current minimum uses R_ext at −tol: 3.3 V/(4 mA·0.8) = 1031 Ω → 1.2 kΩ with a 20 % resistor', () => {
    const r = sizePullResistor(withPin(pullDown(40000), {}, { external: { to: 'down', railV: 0, tolerance: 0.2 } }));
    expect(r.minOhms).toBe(1200); // IEC 60063 E12 round-up of 1031 Ω
  });
});

describe('common practice: 4.7 kΩ pull-up to 5 V against a 40 kΩ internal pull-down', () => {
  it('holds a 5 V CMOS input (VIH 3.5 V) high at ≈ 4.47 V', () => {
    const nodeV = pullNodeVoltageV(0, 40000, 5, 4700);
    expect(nodeV).toBeCloseTo((5 * 40000) / 44700, 12); // divider, re-derived
    expect(nodeV).toBeCloseTo(4.47, 2); // common practice example
    expect(nodeV).toBeGreaterThanOrEqual(0.7 * 5); // CMOS VIH = 0.7·VDD (docs/engineering.md §7)
  });

  it('the pin sinks ≈ 1.06 mA driving low, inside 4 mA', () => {
    const r = sizePullResistor({
      pin: { internalPull: 'down', internalPullOhms: 40000, railV: 5, maxCurrentA: 0.004 },
      external: { to: 'up', railV: 5 },
      node: { mustBe: 'high', limitV: 3.5 },
      series: 'E12',
    });
    // The pin driving low sinks the pull-up's current: 5 V / 4.7 kΩ ≈ 1.06 mA (common practice example).
    expect(worstPullCurrentA(5, 4700, 0) * 1000).toBeCloseTo(1.06, 2);
    expect(r.minOhms as number).toBeLessThanOrEqual(4700); // 5 V / 4 mA = 1.25 kΩ → 1.5 kΩ
    expect(r.maxOhms).toBe(15000); // 40 kΩ·1.5/3.5 = 17.1 kΩ → IEC 60063 E12 round-down 15 kΩ
  });
});

describe('edge cases', () => {
  it('reports no fit when the pin cannot drive any value that holds the node', () => {
    const r = sizePullResistor(withPin(pullDown(40000), { maxCurrentA: 0.0001 }));
    expect(r.ok).toBe(false); // 3.3 V / 0.1 mA = 33 kΩ min > 6.8 kΩ max
    expect(r.chosenOhms).toBeNull();
    expect(r.notes[0]).toMatch(/No E12 value fits/);
  });

  it('rejects a pull in the wrong direction', () => {
    const r = sizePullResistor({ ...pullDown(40000), external: { to: 'up', railV: 3.3 } });
    expect(r.ok).toBe(false);
    expect(r.notes[0]).toMatch(/pull the other way/);
  });

  it('leakage alone can make a fit impossible: 0.5 V/(100 µA·1.01) = 4.95 kΩ max against 3.3 V/(0.1 mA·0.99) = 33 kΩ min', () => {
    const r = sizePullResistor(withPin(noPull(100e-6), { maxCurrentA: 0.0001 }));
    expect(r.ok).toBe(false);
    expect(r.chosenOhms).toBeNull();
  });

  it('warns when the pull-up rail is above the pin supply', () => {
    const r = sizePullResistor({
      ...pullUpAgainstDown,
      external: { to: 'up', railV: 5 },
      node: { mustBe: 'high', limitV: 3.5 },
      series: 'E24',
    });
    expect(r.notes.join(' ')).toMatch(/tolerant/); // docs/engineering.md §9
  });
});

describe('request schema: the new optional fields (api-contract.md, Extensions)', () => {
  const body = {
    pin: { internalPull: 'up', internalPullOhms: 40000, railV: 3.3, maxCurrentA: 0.004 },
    external: { to: 'down', railV: 0 },
    node: { mustBe: 'low', limitV: 0.5 },
    series: 'E12',
  };
  it('accepts the old body unchanged and the new fields within bounds', () => {
    expect(parseCalcBody(calcPullResistorRequestSchema, body).ok).toBe(true);
    const full = {
      ...body,
      pin: { ...body.pin, internalPullTolerance: 0.3, leakageA: 1e-6 },
      external: { ...body.external, tolerance: 0.01 },
      ceilingOhms: 1e6,
    };
    expect(parseCalcBody(calcPullResistorRequestSchema, full).ok).toBe(true);
  });
  it.each([
    ['pin.internalPullTolerance', { ...body, pin: { ...body.pin, internalPullTolerance: 0.95 } }],
    ['pin.leakageA', { ...body, pin: { ...body.pin, leakageA: -1e-6 } }],
    ['pin.leakageA', { ...body, pin: { ...body.pin, leakageA: 0.01 } }],
    ['external.tolerance', { ...body, external: { ...body.external, tolerance: 0.25 } }],
    ['ceilingOhms', { ...body, ceilingOhms: 0 }],
    ['ceilingOhms', { ...body, ceilingOhms: 2e8 }],
  ])('rejects a bad %s with a message naming the field', (path, bad) => {
    const r = parseCalcBody(calcPullResistorRequestSchema, bad);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.issues.map((i) => i.path)).toEqual([path]);
      expect(r.issues[0].message.length).toBeGreaterThan(10);
    }
  });
});

/** The node at every corner, computed here from the divider formula (docs/engineering.md §9) plus I·(R_int‖R_ext). */
function worstNodeByHand(req: PullResistorRequest, ohms: number): number {
  const s = req.node.mustBe === 'low' ? 1 : -1;
  const leak = req.pin.leakageA ?? 0;
  const tolE = req.external.tolerance ?? 0;
  const tolI = req.pin.internalPullTolerance ?? 0;
  const vInt = req.pin.internalPull === 'up' ? req.pin.railV : 0;
  const nodes: number[] = [];
  for (const re of [ohms * (1 - tolE), ohms * (1 + tolE)]) {
    if (req.pin.internalPull === 'none') nodes.push(req.external.railV + s * leak * re);
    else {
      for (const ri of [req.pin.internalPullOhms * (1 - tolI), req.pin.internalPullOhms * (1 + tolI)]) {
        nodes.push((vInt * re + req.external.railV * ri) / (ri + re) + (s * leak * ri * re) / (ri + re));
      }
    }
  }
  return s > 0 ? Math.max(...nodes) : Math.min(...nodes);
}

const nextE12Above = (ohms: number): number => {
  const decade = 10 ** Math.floor(Math.log10(ohms) - 1);
  const i = E12.findIndex((m) => Math.abs(m * decade - ohms) / ohms < 1e-9);
  return i === E12.length - 1 ? E12[0] * decade * 10 : E12[i + 1] * decade;
};

describe('property: the chosen value holds the node at its tolerance extremes with leakage', () => {
  const request = fc
    .record({
      pull: fc.constantFrom('up' as const, 'down' as const, 'none' as const),
      internalOhms: fc.double({ min: 5_000, max: 200_000, noNaN: true }),
      tolI: fc.double({ min: 0, max: 0.5, noNaN: true }),
      tolE: fc.double({ min: 0, max: 0.2, noNaN: true }),
      leakA: fc.double({ min: 0, max: 5e-6, noNaN: true }),
      railV: fc.double({ min: 1.8, max: 5, noNaN: true }),
      limitFraction: fc.double({ min: 0.1, max: 0.9, noNaN: true }),
      mustBe: fc.constantFrom('low' as const, 'high' as const),
    })
    .map((p): PullResistorRequest => ({
      pin: {
        internalPull: p.pull,
        internalPullOhms: p.internalOhms,
        railV: p.railV,
        maxCurrentA: 0.004,
        internalPullTolerance: p.tolI,
        leakageA: p.leakA,
      },
      external: p.mustBe === 'low' ? { to: 'down', railV: 0, tolerance: p.tolE } : { to: 'up', railV: p.railV, tolerance: p.tolE },
      node: { mustBe: p.mustBe, limitV: p.limitFraction * p.railV },
      series: 'E12',
    }));

  it('holds at the chosen value, is at most 1 MΩ, and the next E12 value up would not hold (or passes the ceiling)', () => {
    fc.assert(
      fc.property(request, (req) => {
        const r = sizePullResistor(req);
        if (!r.ok) return r.chosenOhms === null && (r.minOhms ?? 0) > (r.maxOhms ?? 0);
        const chosen = r.chosenOhms as number;
        const node = worstNodeByHand(req, chosen);
        const holds = (v: number): boolean => (req.node.mustBe === 'low' ? v <= req.node.limitV + 1e-12 : v >= req.node.limitV - 1e-12);
        expect(holds(node)).toBe(true);
        expect(r.nodeV as number).toBeCloseTo(node, 9);
        expect(chosen).toBeLessThanOrEqual(1e6);
        const next = nextE12Above(chosen);
        if (next <= 1e6) expect(holds(worstNodeByHand(req, next) + (req.node.mustBe === 'low' ? 1e-12 : -1e-12))).toBe(false);
        return true;
      }),
      { numRuns: 300 },
    );
  });
});
