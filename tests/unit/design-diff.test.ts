/**
 * The revision diff (src/lib/design-diff.ts): each row's label and both values in the units a designer
 * writes them (mΩ below 1 Ω, mA for a pin, kHz, %, °C). Expected strings are written by hand from the inputs.
 */
import { describe, expect, it } from 'vitest';
import { diffDesignInputs, ohms } from '../../src/lib/design-diff.ts';
import type { DesignInput } from '../../src/lib/domain/design.ts';

const base: DesignInput = {
  name: 'Pump A',
  motor: { source: 'catalogue', partId: 7 },
  supply: { minV: 4.75, nomV: 5, maxV: 5.25, preset: 'usb2-port', internalResistanceOhm: 0, continuousCurrentA: 0.5, currentLimitA: 0.5 },
  wiringResistanceOhm: 0.15,
  shuntResistanceOhm: 0,
  logic: {
    railV: 3.3,
    highV: 2.9,
    lowV: 0.4,
    pinSourceCurrentA: 0.008,
    pinSinkCurrentA: 0.008,
    resetPull: 'none',
    resetPullOhms: 0,
    resetPullTolerance: 0,
    sharedSupply: { minSupplyV: 3, regulatorDropoutV: 0.3 },
  },
  drive: { mode: 'pwm', frequencyHz: 20_000, dutyMin: 0.3, dutyMax: 0.95 },
  ambientMinC: 15,
  ambientMaxC: 35,
  load: { kind: 'torque', torqueNm: 0.003 },
  margins: { voltageDerating: 0.8, thermalMarginC: 25 },
  driverSupplyV: null,
  boardQuantity: 5,
  stallProtection: { kind: 'none' },
  resetStartIntent: null,
  selections: {
    switch: { chosenPartId: 11, alternatePartIds: [12] },
    driver: { chosenPartId: null, alternatePartIds: [] },
    diode: { chosenPartId: 31, alternatePartIds: [] },
  },
};
const names = new Map([
  [7, 'HVM-TEST-1'],
  [11, 'QX11'],
  [12, 'QX12'],
  [13, 'QX13'],
  [31, 'DX31'],
]);
const namer = (id: number) => names.get(id);
type Change = [field: string, label: string, before: string, after: string];
const edit = (patch: (d: DesignInput) => void): DesignInput => {
  const copy = structuredClone(base);
  patch(copy);
  return copy;
};

describe('diffDesignInputs', () => {
  it('two equal inputs differ in nothing', () => {
    expect(diffDesignInputs(base, structuredClone(base), namer)).toEqual([]);
  });

  const cases: [string, (d: DesignInput) => void, Change[]][] = [
    [
      'the supply moves from the USB port to a 4 × NiMH pack',
      (d) => {
        d.supply = {
          minV: 4,
          nomV: 4.8,
          maxV: 5.8,
          preset: '4xAA-nimh',
          internalResistanceOhm: 0.12,
          continuousCurrentA: 2,
          currentLimitA: null,
        };
      },
      [
        ['supply.preset', 'Supply preset', 'USB 2.0 port (bench prototype)', '4 × AA NiMH'],
        ['supply.minV', 'Supply minimum', '4.75 V', '4 V'],
        ['supply.nomV', 'Supply nominal', '5 V', '4.8 V'],
        ['supply.maxV', 'Supply maximum', '5.25 V', '5.8 V'],
        ['supply.internalResistanceOhm', 'Supply internal resistance', '0 Ω', '120 mΩ'],
        ['supply.continuousCurrentA', 'Supply continuous rating', '0.5 A', '2 A'],
        ['supply.currentLimitA', 'Supply current limit', '0.5 A', 'none'],
      ],
    ],
    [
      'the controller gets its own supply and the pin is weaker',
      (d) => {
        d.logic.sharedSupply = null;
        d.logic.pinSourceCurrentA = 0.004;
      },
      [
        ['logic.pinSourceCurrentA', 'Logic pin source current', '8 mA', '4 mA'],
        ['logic.sharedSupply', 'Controller fed from', 'the motor supply (brown-out 3 V, regulator dropout 0.3 V)', 'its own supply'],
      ],
    ],
    [
      'PWM becomes on/off, the load a stall only',
      (d) => {
        d.drive = { mode: 'onoff' };
        d.load = { kind: 'stall-only' };
      },
      [
        ['load', 'Running load', 'torque 3 mN·m', 'stall only (no running load given)'],
        ['drive', 'Drive', 'PWM 20 kHz, duty 30 % – 95 %', 'on/off'],
      ],
    ],
    [
      'a different chosen switch, an alternate added, a diode dropped',
      (d) => {
        d.selections.switch = { chosenPartId: 12, alternatePartIds: [11, 13] };
        d.selections.diode = { chosenPartId: null, alternatePartIds: [] };
      },
      [
        ['selections.switch.chosen', 'Low-side switch: chosen part', 'QX11', 'QX12'],
        ['selections.switch.alternates', 'Low-side switch: alternates', 'QX12', 'QX11, QX13'],
        ['selections.diode.chosen', 'Freewheel diode: chosen part', 'DX31', 'none chosen'],
      ],
    ],
    [
      'an unnamed part id reads as part #id; a pull-down at reset with its value; a cut-off; more boards',
      (d) => {
        d.selections.driver.chosenPartId = 99;
        d.logic.resetPull = 'down';
        d.logic.resetPullOhms = 47_000;
        d.logic.resetPullTolerance = 0.3;
        d.stallProtection = { kind: 'cut-off', afterS: 2 };
        d.boardQuantity = 250;
      },
      [
        ['selections.driver.chosen', 'Gate driver / level shifter: chosen part', 'none chosen', 'part #99'],
        ['logic.resetPull', 'Controller pin pull at reset', 'none (pin floats at reset)', 'pull-down 47 kΩ'],
        ['logic.resetPullTolerance', 'Pull tolerance', '0 %', '30 %'],
        ['stallProtection', 'Stall protection', 'none', 'cut-off after 2 s'],
        ['boardQuantity', 'Board quantity', '5', '250'],
      ],
    ],
    [
      'a hand-entered motor replaces the catalogue one; a separate 12 V driver rail; margins',
      (d) => {
        d.motor = {
          source: 'manual',
          label: 'Bench motor',
          params: {
            ratedVoltageV: 6,
            voltageMinV: null,
            voltageMaxV: null,
            noLoadSpeedRpm: 9000,
            noLoadCurrentA: 0.12,
            stallTorqueNm: 0.01,
            stallCurrentA: 2,
            terminalResistanceOhm: 3,
            inductanceH: null,
            rotorInertiaKgM2: null,
          },
        };
        d.driverSupplyV = 12;
        d.margins = { voltageDerating: 0.7, thermalMarginC: 20 };
        d.ambientMaxC = 50;
      },
      [
        ['motor', 'Motor', 'HVM-TEST-1 (catalogue)', 'Bench motor (entered by hand)'],
        ['ambientMaxC', 'Ambient maximum', '35 °C', '50 °C'],
        ['margins.voltageDerating', 'Voltage derating', '80 %', '70 %'],
        ['margins.thermalMarginC', 'Thermal margin', '25 K', '20 K'],
        ['driverSupplyV', 'Gate driver supply', 'the motor supply', 'its own rail, 12 V'],
      ],
    ],
  ];
  it.each(cases)('%s', (_name, patch, expected) => {
    const rows = diffDesignInputs(base, edit(patch), namer).map((c): Change => [c.field, c.label, c.before, c.after]);
    expect(rows).toEqual(expected);
  });

  it('between two hand-entered motors lists each changed datasheet figure in its unit', () => {
    const manual = (noLoadCurrentA: number, stallTorqueNm: number): DesignInput =>
      edit((d) => {
        d.motor = {
          source: 'manual',
          label: 'Bench motor',
          params: {
            ratedVoltageV: 6,
            voltageMinV: null,
            voltageMaxV: null,
            noLoadSpeedRpm: 9000,
            noLoadCurrentA,
            stallTorqueNm,
            stallCurrentA: 2,
            terminalResistanceOhm: 3,
            inductanceH: null,
            rotorInertiaKgM2: null,
          },
        };
      });
    expect(diffDesignInputs(manual(0.12, 0.01), manual(0.15, 0.0125)).map((c) => [c.label, c.before, c.after])).toEqual([
      ['Motor no-load current', '120 mA', '150 mA'],
      ['Motor stall torque', '10 mN·m', '12.5 mN·m'],
    ]);
  });
});

describe('ohms', () => {
  it.each([
    [0, '0 Ω'],
    [0.05, '50 mΩ'],
    [0.12, '120 mΩ'],
    [3.09, '3.09 Ω'],
    [4700, '4.7 kΩ'],
  ])('%d Ω reads %s', (x, text) => expect(ohms(x)).toBe(text));
});
