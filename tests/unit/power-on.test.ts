import { describe, expect, it } from 'vitest';
import { pullDrawCurrentA, walkPowerOn, type MotorState, type PowerOnInput } from '../../src/lib/power-on.ts';
import { driverPart } from './fixtures.ts';

// The power-on walk of docs/engineering.md §power-on (docs/engineering.md §9 and §10 "Driver at reset").
// Realistic set-up for the matrix:
//   pin: 3.3 V logic, internal pull 40 kΩ ±30 % (28–52 kΩ), 4 mA source/sink, leakage 1 µA (the default) [mem];
//   driver: 12 V supply (exactly), TTL-level fixed inputs VIH 2.0 V / VIL 0.8 V [JEDEC JESD8C, from memory],
//           input pull 100 kΩ stated, ±30 % (70–130 kΩ) [judgement]; a single-supply driver's input pull-up
//           goes to its own 12 V supply;
//   gate: VGS(th) min 1.0 V (direct drive: off only below 0.5 V, half of VGS(th) min [judgement]).
// A node above 3.3 V + 0.3 V is clamped by the pin's protection diode at 3.6 V [from memory].
const RAIL_V = 3.3;
const LEAK_A = 1e-6;
const par = (a: number, b: number): number => (a * b) / (a + b);

type PinPull = 'up' | 'down' | 'none';
const pin = (pull: PinPull, over: Partial<PowerOnInput['pin']> = {}): PowerOnInput['pin'] => ({
  railV: RAIL_V,
  resetDefault: { pull, pullOhms: 40000, pullTolerance: 0.3 },
  sourceCurrentA: 0.004,
  sinkCurrentA: 0.004,
  ...over,
});
const gate = { vgsThMinV: 1.0 };
const driver = (inverting: boolean, inputPull: PinPull, inputPullOhms: number | null = 100_000): NonNullable<PowerOnInput['driver']> => ({
  params: driverPart(1, 'KF-GD12', { inverting, inputPull, inputPullOhms, supplyMinV: 4.5, supplyMaxV: 18 }).params,
  supply: { minV: 12, maxV: 12 },
});

// Node ranges by hand (divider V = (V_a·R_b + V_b·R_a)/(R_a + R_b), leakage ±1 µA·(R_a‖R_b)):
//  pin up, no driver pull:   3.3 ± 1µA·52k = 3.248–3.352 V                                   → high
//  pin up vs driver down:    min 3.3·70/(52+70) − 1µA·(52k‖70k) = 1.8934 − 0.0298 = 1.864 V
//                            max 3.3·130/(28+130) + 1µA·(28k‖130k) = 2.7152 + 0.0230 = 2.738 V
//                            (nominal 3.3·100/140 = 2.36 V ≥ 2.0 V looks high, but 1.864 V < VIH) → undetermined
//  pin up + driver up 12 V:  lowest (3.3·130 + 12·28)/158 − 0.023 = 4.82 V > 3.6 V → clamped 3.6 V  → high
//  pin down, no driver pull: ±1µA·52k = ±0.052 V                                              → low
//  pin down + driver down:   ±1µA·(52k‖130k) = ±0.037 V                                       → low
//  pin down vs driver up 12: min 12·28/(28+130) − 1µA·(28k‖130k) = 2.1266 − 0.0230 = 2.104 V ≥ 2.0 V
//                            max 12·52/122 = 5.11 V → clamped 3.6 V                          → high
//  pin floating, no driver pull: nothing pulls the node                                      → floats
//  pin floating + driver down: ±1µA·130k = ±0.13 V                                            → low
//  pin floating + driver up 12 V: 12 ∓ 0.13 V → clamped 3.6 V                                 → high
// Non-inverting: output = input; inverting: flipped; undetermined stays undetermined. Motor off ⇔ gate surely low.
interface Row {
  pinPull: PinPull;
  inverting: boolean | null;
  driverPull: PinPull;
  motor: MotorState;
  reason: string;
}
const MATRIX: Row[] = [
  { pinPull: 'up', inverting: false, driverPull: 'up', motor: 'on', reason: 'node clamped at 3.6 V, high → output high' },
  { pinPull: 'up', inverting: false, driverPull: 'down', motor: 'may-run', reason: 'pulls fight: 1.864–2.738 V straddles VIH 2.0 V' },
  { pinPull: 'up', inverting: false, driverPull: 'none', motor: 'on', reason: '3.248–3.352 V is high → output high' },
  { pinPull: 'up', inverting: true, driverPull: 'up', motor: 'off', reason: 'high input inverted → output low' },
  { pinPull: 'up', inverting: true, driverPull: 'down', motor: 'may-run', reason: 'undetermined input stays undetermined' },
  { pinPull: 'up', inverting: true, driverPull: 'none', motor: 'off', reason: 'high input inverted → output low' },
  { pinPull: 'down', inverting: false, driverPull: 'up', motor: 'on', reason: 'driver pull-up to 12 V wins: ≥ 2.104 V is high' },
  { pinPull: 'down', inverting: false, driverPull: 'down', motor: 'off', reason: '±0.037 V is low → output low' },
  { pinPull: 'down', inverting: false, driverPull: 'none', motor: 'off', reason: '±0.052 V is low → output low' },
  { pinPull: 'down', inverting: true, driverPull: 'up', motor: 'off', reason: '≥ 2.104 V is high, inverted → low' },
  { pinPull: 'down', inverting: true, driverPull: 'down', motor: 'on', reason: 'the polarity trap: low input inverted → high' },
  { pinPull: 'down', inverting: true, driverPull: 'none', motor: 'on', reason: 'the polarity trap: low input inverted → high' },
  { pinPull: 'none', inverting: false, driverPull: 'up', motor: 'on', reason: "driver's own pull-up makes the open input high" },
  { pinPull: 'none', inverting: false, driverPull: 'down', motor: 'off', reason: "driver's own pull-down: ±0.13 V is low" },
  { pinPull: 'none', inverting: false, driverPull: 'none', motor: 'may-run', reason: 'nothing pulls the node: it floats' },
  { pinPull: 'none', inverting: true, driverPull: 'up', motor: 'off', reason: 'open input pulled high, inverted → low' },
  { pinPull: 'none', inverting: true, driverPull: 'down', motor: 'on', reason: 'open input pulled low, inverted → high' },
  { pinPull: 'none', inverting: true, driverPull: 'none', motor: 'may-run', reason: 'nothing pulls the node: it floats' },
  // Direct drive: the pin's node is the gate (off below 0.5 V, on from VGS(th) min 1.0 V).
  { pinPull: 'up', inverting: null, driverPull: 'none', motor: 'on', reason: '3.248 V ≥ VGS(th) min' },
  { pinPull: 'down', inverting: null, driverPull: 'none', motor: 'off', reason: '0.052 V ≤ 0.5 V' },
  { pinPull: 'none', inverting: null, driverPull: 'none', motor: 'may-run', reason: 'the gate floats' },
];

const inputOf = (r: Row): PowerOnInput => ({
  pin: pin(r.pinPull),
  mosfet: gate,
  driver: r.inverting == null ? null : driver(r.inverting, r.driverPull),
});
const rowName = (r: Row): string =>
  `pin ${r.pinPull}, ${r.inverting == null ? 'direct drive' : `${r.inverting ? 'inverting' : 'non-inverting'} driver with input pull ${r.driverPull}`}`;

describe('power-on matrix: 3 pin states × driver polarity × driver input pull, plus direct drive (written by hand)', () => {
  it.each(MATRIX.map((r) => [rowName(r), r] as const))('%s', (_name, row) => {
    const r = walkPowerOn(inputOf(row));
    expect(r.steps.map((s) => s.stage)).toEqual(
      row.inverting == null ? ['pin', 'pull-network', 'gate', 'motor'] : ['pin', 'pull-network', 'driver', 'gate', 'motor'],
    );
    expect(r.motorStateAtReset, row.reason).toBe(row.motor);
    expect(r.steps[r.steps.length - 1].state).toBe(row.motor);
    expect(r.motorCanStart).toBe(row.motor !== 'off');
  });

  it('the fighting row at its hand-computed corners: 1.864–2.738 V', () => {
    const net = walkPowerOn({ pin: pin('up'), mosfet: gate, driver: driver(false, 'down') }).steps[1];
    expect(net.minV as number).toBeCloseTo((RAIL_V * 70e3) / 122e3 - LEAK_A * par(52e3, 70e3), 6);
    expect(net.maxV as number).toBeCloseTo((RAIL_V * 130e3) / 158e3 + LEAK_A * par(28e3, 130e3), 6);
    expect(net.state).toBe('undetermined');
  });

  it('pin pull-down against the driver pull-up to 12 V: the low corner 2.104 V is above VIH 2.0 V', () => {
    const net = walkPowerOn({ pin: pin('down'), mosfet: gate, driver: driver(false, 'up') }).steps[1];
    expect(net.minV as number).toBeCloseTo((12 * 28e3) / 158e3 - LEAK_A * par(28e3, 130e3), 6);
    expect(net.maxV).toBeCloseTo(3.6, 9); // clamped by the pin's protection diode
    expect(net.note).toMatch(/protection diode/);
  });
});

// Recommended pulls, by hand. Limit: VIL 0.8 − 0.33 = 0.47 V (pull-down) or VIH 2.0 + 0.33 = 2.33 V (pull-up), the
// margin 10 % of the 3.3 V rail [common practice, docs/engineering.md §9]; direct drive 0.5 V. Opposing pulls at their
// strongest (−30 %), in parallel; bound R ≤ R_th·d_ext/((d_int + 1µA·R_th)·1.01), rounded down in IEC 60063 E12.
const bound = (rThOhms: number | null, vThV: number, limitV: number, extV: number): number => {
  const s = extV < limitV ? 1 : -1;
  const dExt = s * (limitV - extV);
  if (rThOhms == null) return dExt / (LEAK_A * 1.01);
  return (rThOhms * dExt) / ((s * (vThV - limitV) + LEAK_A * rThOhms) * 1.01);
};
const R20K = par(28e3, 70e3); // pin 28 kΩ ‖ driver 70 kΩ = 20 kΩ
const V_TH_MIXED = (3.3 / 28e3 + 12 / 70e3) * R20K; // 5.786 V
const E12_NEXT: Record<number, number> = {
  1500: 1800,
  2700: 3300,
  3900: 4700,
  4700: 5600,
  6800: 8200,
  10000: 12000,
  27000: 33000,
  390000: 470000,
  470000: 560000,
  820000: 1e6,
};
const RECOMMENDED: { row: Row; ohms: number; raw: number }[] = [
  { row: MATRIX[0], ohms: 1500, raw: bound(R20K, V_TH_MIXED, 0.47, 0) }, // 1744 Ω
  { row: MATRIX[1], ohms: 3900, raw: bound(28e3, 3.3, 0.47, 0) }, // 4559 Ω (the driver pull-down helps: ignored)
  { row: MATRIX[2], ohms: 3900, raw: bound(28e3, 3.3, 0.47, 0) },
  { row: MATRIX[4], ohms: 27000, raw: bound(70e3, 0, 2.33, 3.3) }, // 28 011 Ω against the driver pull-down
  { row: MATRIX[6], ohms: 2700, raw: bound(70e3, 12, 0.47, 0) }, // 2808 Ω against the 12 V pull-up
  { row: MATRIX[10], ohms: 6800, raw: bound(R20K, 0, 2.33, 3.3) }, // 8174 Ω against both pull-downs
  { row: MATRIX[11], ohms: 10000, raw: bound(28e3, 0, 2.33, 3.3) }, // 11 404 Ω
  { row: MATRIX[12], ohms: 2700, raw: bound(70e3, 12, 0.47, 0) },
  { row: MATRIX[14], ohms: 390000, raw: bound(null, 0, 0.47, 0) }, // leakage only: 465 kΩ
  { row: MATRIX[16], ohms: 27000, raw: bound(70e3, 0, 2.33, 3.3) },
  { row: MATRIX[17], ohms: 820000, raw: bound(null, 0, 2.33, 3.3) }, // 960 kΩ
  { row: MATRIX[18], ohms: 4700, raw: bound(28e3, 3.3, 0.5, 0) }, // 4901 Ω
  { row: MATRIX[20], ohms: 470000, raw: bound(null, 0, 0.5, 0) }, // 495 kΩ
];

describe('every matrix row where the motor can start gets a pull that the re-walk proves, or a note', () => {
  it('the table above covers exactly the rows where the motor can start', () => {
    expect(RECOMMENDED.map((r) => r.row)).toEqual(MATRIX.filter((r) => r.motor !== 'off'));
  });

  it.each(RECOMMENDED.map((r) => [rowName(r.row), r] as const))('%s', (_name, { row, ohms, raw }) => {
    const r = walkPowerOn(inputOf(row));
    const wantUp = row.inverting === true; // inverting: pull-up to the logic rail; otherwise pull-down to 0 V
    expect(r.recommendedPull?.to).toBe(wantUp ? 'up' : 'down');
    expect(r.recommendedPull?.railV).toBe(wantUp ? RAIL_V : 0);
    expect(r.recommendedPull?.chosenOhms).toBe(ohms);
    expect(ohms).toBeLessThanOrEqual(raw); // rounded down …
    expect(E12_NEXT[ohms]).toBeGreaterThan(raw); // … to the largest E12 value that holds
    expect(r.withRecommendedPull?.motorState).toBe('off');
    expect(r.note).toMatch(/Fit a .* ±1 % pull-(up|down)/);
  });

  it('no recommendation, and a note saying what to change, when the pin cannot drive any pull that holds', () => {
    // 3.3 V/(10 µA·0.99) = 333 kΩ minimum against a 4.7 kΩ maximum
    const r = walkPowerOn({ pin: pin('up', { sourceCurrentA: 10e-6 }), mosfet: gate });
    expect(r.motorStateAtReset).toBe('on');
    expect(r.recommendedPull).toBeNull();
    expect(r.note).toMatch(/No external pull-down/);
    expect(r.note).toMatch(/pin whose reset state is a pull-down/);
  });

  it('no recommendation for an inverting driver whose VIH the logic rail cannot reach (CMOS-ratio 0.7·12 V = 8.4 V)', () => {
    const ratio = {
      ...driver(true, 'down'),
      params: { ...driver(true, 'down').params, inputLogic: 'ratio' as const, inputHighMin: 0.7, inputLowMax: 0.3 },
    };
    const r = walkPowerOn({ pin: pin('down'), mosfet: gate, driver: ratio });
    expect(r.motorStateAtReset).toBe('on'); // ±0.037 V ≤ 0.3·12 = 3.6 V: low, inverted → high
    expect(r.recommendedPull).toBeNull();
    expect(r.note).toMatch(/cannot take the node up to 8\.4 V/);
    expect(r.note).toMatch(/non-inverting driver/);
    expect(r.note).not.toMatch(/pull the other way/); // that advice would start the motor
  });
});

describe('the customer case: inverting driver with an internal input pull-down on a floating pin', () => {
  it('runs the motor at reset: input low → output high → gate high', () => {
    const r = walkPowerOn({ pin: pin('none'), mosfet: gate, driver: driver(true, 'down') });
    expect(r.steps.map((s) => s.state)).toEqual(['undetermined', 'low', 'high', 'high', 'on']);
    expect(r.motorStateAtReset).toBe('on');
    expect(r.steps[1].maxV as number).toBeCloseTo(LEAK_A * 130e3, 9); // 1 µA into the weakest pull-down, 0.13 V
  });

  it('a 27 kΩ pull-up to 3.3 V holds it off; re-walked low corner by hand 2.355 V ≥ 2.0 V', () => {
    const r = walkPowerOn({ pin: pin('none'), mosfet: gate, driver: driver(true, 'down') });
    const net = r.withRecommendedPull?.steps[1];
    const rUp = 27e3 * 1.01;
    expect(net?.minV as number).toBeCloseTo((RAIL_V * 70e3) / (70e3 + rUp) - LEAK_A * par(70e3, rUp), 6);
    expect(r.withRecommendedPull?.steps.map((s) => s.state)).toEqual(['undetermined', 'high', 'low', 'low', 'off']);
  });
});

describe('details of the walk', () => {
  it('a driver input pull the datasheet does not state is bracketed 10 kΩ–1 MΩ: 1 µA·1 MΩ = 1.0 V > VIL 0.8 V', () => {
    const r = walkPowerOn({ pin: pin('none'), mosfet: gate, driver: driver(false, 'down', null) });
    expect(r.steps[1].maxV as number).toBeCloseTo(1.0, 9);
    expect(r.motorStateAtReset).toBe('may-run');
    expect(r.steps[1].note).toMatch(/not stated/);
  });

  it('an external pull already fitted (1 % default) holds the gate: 4.7 kΩ down against 28 kΩ up → 0.482 V ≤ 0.5 V', () => {
    const r = walkPowerOn({ pin: pin('up'), mosfet: gate, externalPull: { to: 'down', ohms: 4700, railV: 0 } });
    expect(r.steps[1].maxV as number).toBeCloseTo((3.3 * 4747) / 32747 + LEAK_A * par(28e3, 4747), 6);
    expect(r.motorStateAtReset).toBe('off');
    expect(r.recommendedPull).toBeNull();
    expect(r.withRecommendedPull).toBeNull();
  });

  it('a 10 % external resistor is judged at its worst end: 4.7 kΩ·1.1 against 28 kΩ gives 0.525 V > 0.5 V', () => {
    const r = walkPowerOn({ pin: pin('up'), mosfet: gate, externalPull: { to: 'down', ohms: 4700, railV: 0, tolerance: 0.1 } });
    expect(r.steps[1].maxV as number).toBeCloseTo((3.3 * 5170) / 33170 + LEAK_A * par(28e3, 5170), 6);
    expect(r.motorStateAtReset).toBe('may-run');
  });

  it('the pin supplies V_high/(R·0.99) into a recommended pull-down while it drives high', () => {
    const r = walkPowerOn({ pin: pin('up'), mosfet: gate });
    expect(r.pullDrawWhenHighA).toBeCloseTo(3.3 / (4700 * 0.99), 12); // Ohm's law at the −1 % end
    expect(pullDrawCurrentA(r.recommendedPull, 3.0)).toBeCloseTo(3.0 / (4700 * 0.99), 12);
    expect(pullDrawCurrentA(null, 3.3)).toBe(0);
    const up = walkPowerOn({ pin: pin('down'), mosfet: gate, driver: driver(true, 'none') });
    expect(pullDrawCurrentA(up.recommendedPull, 3.3)).toBe(0); // a pull-up draws nothing while the pin is high
  });

  it('no leakage given as 0: the floating pin with a driver pull-down sits at exactly 0 V', () => {
    const r = walkPowerOn({ pin: pin('none', { leakageA: 0 }), mosfet: gate, driver: driver(false, 'down') });
    expect(r.steps[1].minV).toBe(0);
    expect(r.steps[1].maxV).toBe(0);
  });
});
