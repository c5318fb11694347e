import { describe, expect, it } from 'vitest';
import { calcMotor, calcPullResistor, calcSwitch } from '../../src/lib/calc.ts';
import {
  calcMotorRequestSchema,
  calcPullResistorRequestSchema,
  calcSwitchRequestSchema,
  parseCalcBody,
} from '../../src/lib/schemas/calc.ts';

/** api-contract.md request examples. */
import { MOTOR_BODY, PULL_BODY, SWITCH_BODY } from '../helpers/contract-examples.ts';

describe('valid bodies', () => {
  it('motor: defaults and the contract response (api-contract.md example values)', () => {
    const parsed = parseCalcBody(calcMotorRequestSchema, MOTOR_BODY);
    if (!parsed.ok) throw new Error('expected valid');
    expect(parsed.data.seriesResistanceOhm).toBe(0); // contract default
    expect(parsed.data.curvePoints).toBe(21); // contract default
    const r = calcMotor(parsed.data);
    expect(r.resistanceOhm).toBeCloseTo(1.6667, 4); // api-contract.md example
    expect(r.frictionTorqueNm).toBeCloseTo(0.00042441, 8); // api-contract.md example
    expect(r.consistency).toEqual({ torqueRatio: expect.closeTo(1.0, 4), warning: null });
    expect(r.atSupply.maxPower.powerW).toBeCloseTo(1.0667, 4); // api-contract.md example
    expect(r.atSupply.maxEfficiency.efficiency).toBeCloseTo(0.4444, 4); // api-contract.md example
    expect(r.curve).toHaveLength(21);
    expect(Object.keys(r.curve[0]).sort()).toEqual(['currentA', 'efficiency', 'powerW', 'speedRpm', 'torqueNm']);
  });

  it('pull resistor: contract fields', () => {
    const parsed = parseCalcBody(calcPullResistorRequestSchema, PULL_BODY);
    if (!parsed.ok) throw new Error('expected valid');
    const r = calcPullResistor(parsed.data);
    expect(Object.keys(r).sort()).toEqual(['activeCurrentA', 'chosenOhms', 'maxOhms', 'minOhms', 'nodeV', 'notes', 'ok']);
    expect(r.chosenOhms).toBe(6800); // docs/engineering.md §9 example
  });

  it('switch: contract fields', () => {
    const parsed = parseCalcBody(calcSwitchRequestSchema, SWITCH_BODY);
    if (!parsed.ok) throw new Error('expected valid');
    const r = calcSwitch(parsed.data);
    // api-contract.md fields, plus the jam figures of its "Extensions"
    expect(Object.keys(r).sort()).toEqual([
      'checks',
      'conductionLossW',
      'gateDrivePowerW',
      'junctionC',
      'rdsOnAtDriveOhms',
      'stallCurrentRmsA',
      'stallJunctionC',
      'switchingLossW',
      'verdict',
    ]);
    // api-contract.md "Extensions": no stall protection given → a 3 A steady jam, which this SOT-23-class part cannot hold
    expect(r.verdict).toBe('fail');
    expect(r.checks.filter((c) => !c.ok).map((c) => c.id)).toEqual(['stall-thermal']);
  });

  it('switch: optional fields may be left out (plain on/off)', () => {
    const { pwmHz: _p, duty: _d, gateResistanceOhm: _g, ...operating } = SWITCH_BODY.operating;
    const { qgdNc: _a, qgsNc: _b, vPlateauV: _c, rdsOnTempCoeffPerC: _t, ...mosfet } = SWITCH_BODY.mosfet;
    expect(parseCalcBody(calcSwitchRequestSchema, { mosfet, operating }).ok).toBe(true);
  });
});

describe.each([
  // schema, body, expected issue path — api-contract.md error shape
  ['motor', calcMotorRequestSchema, { ...MOTOR_BODY, motor: { ...MOTOR_BODY.motor, noLoadCurrentA: 2 } }, 'motor.noLoadCurrentA'],
  ['motor', calcMotorRequestSchema, { ...MOTOR_BODY, supplyV: -1 }, 'supplyV'],
  ['motor', calcMotorRequestSchema, { ...MOTOR_BODY, motor: { ...MOTOR_BODY.motor, stallTorqueNm: 'x' } }, 'motor.stallTorqueNm'],
  ['pull', calcPullResistorRequestSchema, { ...PULL_BODY, series: 'E13' }, 'series'],
  ['pull', calcPullResistorRequestSchema, { ...PULL_BODY, pin: { ...PULL_BODY.pin, internalPullOhms: 0 } }, 'pin.internalPullOhms'],
  ['switch', calcSwitchRequestSchema, { ...SWITCH_BODY, operating: { ...SWITCH_BODY.operating, duty: 1.5 } }, 'operating.duty'],
  [
    'switch',
    calcSwitchRequestSchema,
    { ...SWITCH_BODY, mosfet: { ...SWITCH_BODY.mosfet, rdsOn: [{ vgsV: 4.5, ohms: -1 }] } },
    'mosfet.rdsOn.0.ohms',
  ],
  [
    'switch',
    calcSwitchRequestSchema,
    { ...SWITCH_BODY, operating: { ...SWITCH_BODY.operating, ambientC: undefined } },
    'operating.ambientC',
  ],
] as const)('%s: invalid body', (_name, schema, body, path) => {
  it(`reports ${path}`, () => {
    const r = parseCalcBody(schema, body);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.error).toMatch(/\.$/);
    expect(r.issues.map((i) => i.path)).toContain(path);
  });
});
