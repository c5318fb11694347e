import { describe, expect, it } from 'vitest';
import { walkPowerOn, type PowerOnInput } from '../../src/lib/power-on.ts';
import { driverPart } from './fixtures.ts';

const pin = (pull: 'up' | 'down' | 'none'): PowerOnInput['pin'] => ({
  railV: 3.3, resetDefault: { pull, pullOhms: 40000, pullTolerance: 0.3 }, sourceCurrentA: 0.004, sinkCurrentA: 0.004,
});
const gate = { vgsThMinV: 1.0 };
// The open-input output level these cases were written for, as the input pull that gives it.
const pullFor = (inverting: boolean, openOutput: 'low' | 'high' | 'floating') =>
  openOutput === 'floating' ? 'none' : (openOutput === 'high') !== inverting ? 'up' : 'down';
const driver = (inverting: boolean, openOutput: 'low' | 'high' | 'floating' = 'low') => ({
  params: driverPart(1, 'INV-GD1', { inverting, inputPull: pullFor(inverting, openOutput) }).params, supply: { minV: 11, maxV: 13 },
});

describe('reset walk, pin → pull → driver → gate → motor (domain.md §6)', () => {
  it.each([
    ['direct gate, internal pull-down', { pin: pin('down'), mosfet: gate }, 'off'], // domain.md §6: 0 V node holds the gate off
    ['direct gate, internal pull-up', { pin: pin('up'), mosfet: gate }, 'on'], // domain.md §6: 3.3 V node is above VGS(th)min
    ['direct gate, floating pin', { pin: pin('none'), mosfet: gate }, 'may-run'], // domain.md §6: nothing defines the gate
    ['non-inverting driver, pull-down', { pin: pin('down'), mosfet: gate, driver: driver(false) }, 'off'], // domain.md §5–6
    ['inverting driver, pull-down: the polarity trap', { pin: pin('down'), mosfet: gate, driver: driver(true) }, 'on'], // domain.md §5
    ['floating pin, driver input defaults low', { pin: pin('none'), mosfet: gate, driver: driver(false, 'low') }, 'off'], // domain.md §6: the driver's own input default decides
    ['floating pin, driver input floats', { pin: pin('none'), mosfet: gate, driver: driver(false, 'floating') }, 'may-run'], // domain.md §6
  ] as const)('%s → motor %s', (_name, input, motor) => {
    const walkInput = input as PowerOnInput;
    const r = walkPowerOn(walkInput);
    expect(r.steps.map((s) => s.stage)).toEqual(walkInput.driver ? ['pin', 'pull-network', 'driver', 'gate', 'motor'] : ['pin', 'pull-network', 'gate', 'motor']);
    expect(r.steps[r.steps.length - 1].state).toBe(motor);
    expect(r.motorCanStart).toBe(motor !== 'off');
  });

  it('sizes a pull-down against the internal pull-up at its minimum, and it holds the gate off', () => {
    const r = walkPowerOn({ pin: pin('up'), mosfet: gate });
    // domain.md §6: R_ext ≤ R_int,min·V_lim/(V_pull − V_lim), R_int,min = 40 kΩ·0.7, V_lim = ½·VGS(th)min (judgement)
    const rawMax = (28000 * 0.5) / (3.3 - 0.5);
    expect(r.recommendedPull?.to).toBe('down');
    expect(r.recommendedPull?.chosenOhms).toBe(4700); // IEC 60063 E12 round-down of 5 kΩ
    expect(r.recommendedPull?.chosenOhms as number).toBeLessThanOrEqual(rawMax);
    const fixed = walkPowerOn({ pin: pin('up'), mosfet: gate, externalPull: { to: 'down', ohms: 4700, railV: 0 } });
    expect(fixed.motorCanStart).toBe(false);
  });

  it('sizes a pull-up for an inverting driver', () => {
    const r = walkPowerOn({ pin: pin('down'), mosfet: gate, driver: driver(true) });
    expect(r.recommendedPull?.to).toBe('up'); // domain.md §5: inverting stage needs the pin held high
    // domain.md §6: R_ext ≤ R_int,min·(V_ext − VIH)/VIH with VIH 2.0 V (fixed TTL input)
    expect(r.recommendedPull?.chosenOhms as number).toBeLessThanOrEqual((28000 * 1.3) / 2.0);
    const fixed = walkPowerOn({ pin: pin('down'), mosfet: gate, driver: driver(true), externalPull: { to: 'up', ohms: r.recommendedPull?.chosenOhms as number, railV: 3.3 } });
    expect(fixed.motorCanStart).toBe(false);
  });
});
