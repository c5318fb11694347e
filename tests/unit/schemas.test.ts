import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { designInputSchema } from '../../src/lib/schemas/design.ts';
import { partInputSchema } from '../../src/lib/schemas/parts.ts';
import { calcMotor, calcPullResistor, calcSwitch } from '../../src/lib/calc.ts';
import {
  calcMotorRequestSchema,
  calcPullResistorRequestSchema,
  calcSupplyRequestSchema,
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

/*
 * Realistic bounds (src/lib/schemas/bounds.ts): the smallest subnormal (5e-324) and a near-overflow
 * (1e308) are refused by name in every schema, for each number field listed; the valid bases are the
 * api-contract.md examples, a hand-written design and hand-written parts (invented values).
 */
type Path = (string | number)[];
const setAt = (body: unknown, path: Path, value: unknown): unknown => {
  const copy = structuredClone(body) as Record<string | number, unknown>;
  let at = copy as Record<string | number, unknown>;
  for (const key of path.slice(0, -1)) at = at[key] as Record<string | number, unknown>;
  at[path[path.length - 1]] = value;
  return copy;
};

const DESIGN_BASE = {
  name: 'Bounds fan, 12 V',
  motor: { source: 'manual', label: 'Bench fan motor', params: { ...MOTOR_BODY.motor, terminalResistanceOhm: 1.5, inductanceH: 0.0004 } },
  supply: { minV: 11.4, nomV: 12, maxV: 12.6, internalResistanceOhm: 0.1, continuousCurrentA: 3, currentLimitA: 2 },
  wiringResistanceOhm: 0.05,
  shuntResistanceOhm: 0,
  logic: {
    railV: 3.3,
    highV: 2.9,
    lowV: 0.4,
    pinSourceCurrentA: 0.008,
    pinSinkCurrentA: 0.008,
    resetPull: 'none',
    resetPullOhms: 40000,
    resetPullTolerance: 0.3,
  },
  drive: { mode: 'pwm', frequencyHz: 20000, dutyMin: 0.2, dutyMax: 0.9 },
  ambientMinC: 0,
  ambientMaxC: 40,
  load: { kind: 'torque', torqueNm: 0.001 },
  stallProtection: { kind: 'current-limit', limitA: 2 },
  margins: {},
  boardQuantity: 25,
};
const DIODE_PART = {
  category: 'diode',
  manufacturer: 'Invented Rectifiers',
  mpn: 'IR-SB140',
  params: { kind: 'schottky', vrrmV: 40, ifAvA: 1, ifsmA: 25, vfV: 0.45, vfAtIfA: 1, trrNs: 5, ifrmA: 3, rthJaCPerW: 100, tjMaxC: 150 },
  sources: [{ distributor: 'Invented Parts Co', sku: 'IPC-1', moq: 1, stockQty: 10, priceBreaks: [{ qty: 100, unitPrice: 0.12 }] }],
};
const SUPPLY_BODY = { motor: MOTOR_BODY.motor, supply: { voltageV: 3, internalResistanceOhm: 0.2 }, seriesResistanceOhm: 0.1 };

const BOUNDED: { name: string; schema: z.ZodType; base: unknown; paths: Path[] }[] = [
  {
    name: 'calc motor',
    schema: calcMotorRequestSchema,
    base: MOTOR_BODY,
    paths: [
      ['motor', 'ratedVoltageV'],
      ['motor', 'noLoadSpeedRpm'],
      ['motor', 'noLoadCurrentA'],
      ['motor', 'stallTorqueNm'],
      ['supplyV'],
      ['seriesResistanceOhm'],
    ],
  },
  {
    name: 'calc pull resistor',
    schema: calcPullResistorRequestSchema,
    base: PULL_BODY,
    paths: [
      ['pin', 'internalPullOhms'],
      ['pin', 'railV'],
      ['pin', 'maxCurrentA'],
      ['external', 'railV'],
      ['node', 'limitV'],
    ],
  },
  {
    name: 'calc switch',
    schema: calcSwitchRequestSchema,
    base: SWITCH_BODY,
    paths: [
      ['mosfet', 'vdsMaxV'],
      ['mosfet', 'idPulsedA'],
      ['mosfet', 'rthJaCPerW'],
      ['mosfet', 'qgTotalNc'],
      ['mosfet', 'rdsOn', 0, 'ohms'],
      ['operating', 'supplyMaxV'],
      ['operating', 'runningCurrentA'],
      ['operating', 'gateDriveCurrentA'],
      ['operating', 'gateResistanceOhm'],
      ['operating', 'diodeForwardV'],
    ],
  },
  {
    name: 'calc supply',
    schema: calcSupplyRequestSchema,
    base: SUPPLY_BODY,
    paths: [
      ['motor', 'ratedVoltageV'],
      ['motor', 'noLoadSpeedRpm'],
      ['supply', 'voltageV'],
      ['supply', 'internalResistanceOhm'],
      ['seriesResistanceOhm'],
    ],
  },
  {
    name: 'design input',
    schema: designInputSchema,
    base: DESIGN_BASE,
    paths: [
      ['motor', 'params', 'ratedVoltageV'],
      ['motor', 'params', 'noLoadSpeedRpm'],
      ['motor', 'params', 'stallTorqueNm'],
      ['motor', 'params', 'inductanceH'],
      ['supply', 'nomV'],
      ['supply', 'continuousCurrentA'],
      ['wiringResistanceOhm'],
      ['logic', 'pinSourceCurrentA'],
      ['logic', 'resetPullOhms'],
      ['drive', 'frequencyHz'],
      ['drive', 'dutyMin'],
      ['load', 'torqueNm'],
      ['stallProtection', 'limitA'],
      ['boardQuantity'],
    ],
  },
  {
    name: 'part (diode with a source)',
    schema: partInputSchema,
    base: DIODE_PART,
    paths: [
      ['params', 'vrrmV'],
      ['params', 'ifAvA'],
      ['params', 'ifsmA'],
      ['params', 'vfV'],
      ['params', 'trrNs'],
      ['params', 'rthJaCPerW'],
      ['sources', 0, 'moq'],
      ['sources', 0, 'stockQty'],
      ['sources', 0, 'priceBreaks', 0, 'qty'],
      ['sources', 0, 'priceBreaks', 0, 'unitPrice'],
    ],
  },
];

describe.each(BOUNDED)('realistic bounds: $name', ({ schema, base, paths }) => {
  it('the base body is valid', () => {
    const parsed = schema.safeParse(base);
    expect(parsed.success, JSON.stringify(parsed.error?.issues)).toBe(true);
  });
  it.each(paths.flatMap((path) => [5e-324, 1e308, -1e308, 4_294_967_296].map((value) => [path.join('.'), path, value] as const)))(
    '%s = %d is refused naming the field',
    (_name, path, value) => {
      const parsed = schema.safeParse(setAt(base, path, value));
      expect(parsed.success).toBe(false);
      expect(parsed.error!.issues.map((i) => i.path.join('.'))).toContain(path.join('.'));
    },
  );
});

describe('realistic bounds keep what real designs need (common practice, from memory)', () => {
  it.each([
    ['a 600 V MOSFET rating', ['mosfet', 'vdsMaxV'], 600],
    ['a 1.2 kA pulsed current rating', ['mosfet', 'idPulsedA'], 1200],
    ['1 mΩ on-resistance', ['mosfet', 'rdsOn', 0, 'ohms'], 0.001],
    ['a 2 MHz PWM', ['operating', 'pwmHz'], 2e6],
    ['−40 °C ambient', ['operating', 'ambientC'], -40],
  ])('calc switch accepts %s', (_what, path, value) => {
    expect(calcSwitchRequestSchema.safeParse(setAt(SWITCH_BODY, path as Path, value)).success).toBe(true);
  });
  it('a pull calculation accepts 1 µA pin current and 10 MΩ internal pull', () => {
    expect(
      calcPullResistorRequestSchema.safeParse(setAt(setAt(PULL_BODY, ['pin', 'maxCurrentA'], 1e-6), ['pin', 'internalPullOhms'], 1e7))
        .success,
    ).toBe(true);
  });
});
