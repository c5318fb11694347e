/**
 * Request schemas of the three calculators [api-contract.md] and the issue list they produce.
 */
import { z } from 'zod';
import { issuesOf, type ApiIssue } from './issues.ts';
import { E_SERIES_NAMES } from '../eseries.ts';
import { calcSupply } from '../supply.ts';
import { positiveIn, RANGES, zeroOrIn, type RangeName } from './bounds.ts';

const positive = (range: RangeName): z.ZodNumber => positiveIn(range);
const nonNegative = (range: RangeName): z.ZodNumber => zeroOrIn(range);

export const motorPointsSchema = z
  .object({
    ratedVoltageV: positive('voltageV'),
    noLoadSpeedRpm: positive('speedRpm'),
    noLoadCurrentA: positive('currentA'),
    stallCurrentA: positive('surgeA'),
    stallTorqueNm: positive('torqueNm'),
    /** Optional measured terminal resistance; replaces V/Is. */
    terminalResistanceOhm: positive('resistanceOhm').optional(),
  })
  .superRefine((m, ctx) => {
    if (m.noLoadCurrentA >= m.stallCurrentA) {
      ctx.addIssue({ code: 'custom', path: ['noLoadCurrentA'], message: 'No-load current must be below the stall current.' });
    }
    const resistanceOhm = m.terminalResistanceOhm ?? m.ratedVoltageV / m.stallCurrentA;
    if (m.terminalResistanceOhm != null && m.noLoadCurrentA * resistanceOhm >= m.ratedVoltageV) {
      ctx.addIssue({
        code: 'custom',
        path: ['terminalResistanceOhm'],
        message: 'With this resistance the no-load current would drop the whole rated voltage.',
      });
    }
  });

export const calcMotorRequestSchema = z.object({
  motor: motorPointsSchema,
  supplyV: positive('voltageV'),
  seriesResistanceOhm: nonNegative('resistanceOhm').default(0),
  curvePoints: z.number().int().min(2).max(501).default(21),
});
export type CalcMotorRequest = z.infer<typeof calcMotorRequestSchema>;

export const calcPullResistorRequestSchema = z
  .object({
    pin: z.object({
      internalPull: z.enum(['up', 'down', 'none']),
      internalPullOhms: nonNegative('resistanceOhm'),
      railV: positive('voltageV'),
      maxCurrentA: positive('currentA'),
      /** Fraction (0.3 = ±30 %); absent = 0 [api-contract.md, Extensions]. */
      internalPullTolerance: z
        .number()
        .min(0, { error: 'The internal-pull tolerance is a fraction from 0 to 0.9 (0.3 means ±30 %).' })
        .max(0.9, { error: 'The internal-pull tolerance is a fraction from 0 to 0.9 (0.3 means ±30 %).' })
        .optional(),
      /** Pin input leakage in A; absent = 0. */
      leakageA: z
        .number()
        .min(0, { error: 'Pin leakage is a current in A from 0 to 0.001 (1 µA is 0.000001).' })
        .max(1e-3, { error: 'Pin leakage is a current in A from 0 to 0.001 (1 µA is 0.000001).' })
        .optional(),
    }),
    external: z.object({
      to: z.enum(['up', 'down']),
      railV: nonNegative('voltageV'),
      /** Fraction (0.01 = ±1 %); absent = 0. */
      tolerance: z
        .number()
        .min(0, { error: 'The resistor tolerance is a fraction from 0 to 0.2 (0.01 means ±1 %).' })
        .max(0.2, { error: 'The resistor tolerance is a fraction from 0 to 0.2 (0.01 means ±1 %).' })
        .optional(),
    }),
    node: z.object({ mustBe: z.enum(['low', 'high']), limitV: nonNegative('voltageV') }),
    series: z.enum(E_SERIES_NAMES),
    /** Largest resistance worth fitting; absent = 1 MΩ. */
    ceilingOhms: z
      .number()
      .min(RANGES.resistanceOhm.min, { error: 'The ceiling is a resistance in Ω from 1 µΩ to 100 MΩ (1e8).' })
      .max(1e8, { error: 'The ceiling is a resistance in Ω above 0 and at most 100 MΩ (1e8).' })
      .optional(),
  })
  .superRefine((b, ctx) => {
    if (b.pin.internalPull !== 'none' && !(b.pin.internalPullOhms > 0)) {
      ctx.addIssue({ code: 'custom', path: ['pin', 'internalPullOhms'], message: 'An internal pull needs a resistance above zero.' });
    }
  });
export type CalcPullResistorRequest = z.infer<typeof calcPullResistorRequestSchema>;

const rdsOnPointSchema = z.object({
  vgsV: positive('voltageV'),
  ohms: positive('resistanceOhm'),
  testCurrentA: positive('surgeA').optional(),
});

/** Extensions for a jammed motor [api-contract.md "Extensions"]: absent = no protection, full-on jam. */
const stallProtectionSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('none') }),
  z.object({ kind: z.literal('current-limit'), limitA: positive('currentA') }),
  z.object({ kind: z.literal('cut-off'), afterS: positive('timeS').max(3600) }),
]);
const zthPointSchema = z.object({ pulseS: positive('timeS').max(10_000), zthCPerW: positive('thermalCPerW') });

export const calcSwitchRequestSchema = z.object({
  mosfet: z.object({
    vdsMaxV: positive('ratingV'),
    vgsMaxV: positive('voltageV'),
    vgsThMaxV: positive('voltageV'),
    idPulsedA: positive('surgeA'),
    tjMaxC: z.number().min(25).max(250),
    rthJaCPerW: positive('thermalCPerW'),
    qgTotalNc: positive('chargeNc'),
    qgdNc: positive('chargeNc').optional(),
    qgsNc: positive('chargeNc').optional(),
    vPlateauV: positive('voltageV').optional(),
    rdsOn: z.array(rdsOnPointSchema).min(1).max(20),
    rdsOnTempCoeffPerC: z.number().min(0).max(0.05).optional(),
    zthPoints: z.array(zthPointSchema).max(20).optional(),
  }),
  operating: z.object({
    supplyMaxV: positive('voltageV'),
    runningCurrentA: nonNegative('currentA'),
    stallCurrentA: nonNegative('surgeA'),
    gateDriveV: positive('voltageV'),
    gateDriveCurrentA: positive('currentA'),
    gateResistanceOhm: nonNegative('resistanceOhm').optional(),
    pwmHz: positive('frequencyHz').optional(),
    duty: z.number().min(0).max(1).optional(),
    ambientC: z.number().min(-60).max(200),
    diodeForwardV: nonNegative('voltageV'),
    stallProtection: stallProtectionSchema.optional(),
    stallDuty: z.number().min(0).max(1).optional(),
  }),
  margins: z
    .object({ voltageDerating: z.number().gt(0).max(1).optional(), thermalMarginC: z.number().min(0).max(200).optional() })
    .optional(),
});
export type CalcSwitchRequest = z.infer<typeof calcSwitchRequestSchema>;

export type { ApiIssue };

export type ParseResult<T> = { ok: true; data: T } | { ok: false; error: string; issues: ApiIssue[] };

export function parseCalcBody<S extends z.ZodType>(schema: S, body: unknown): ParseResult<z.infer<S>> {
  const parsed = schema.safeParse(body);
  if (parsed.success) return { ok: true, data: parsed.data };
  return { ok: false, error: 'Some fields are missing or out of range.', issues: issuesOf(parsed.error) };
}

/* POST /api/calc/supply [api-contract.md]: only `motor` and `supply.voltageV` are required. */
const numberOf = (what: string): z.ZodNumber =>
  z.number({ error: (issue) => (issue.input === undefined ? `${what} is required` : `${what} must be a number`) });
/** Above zero, at least `floor` (so 5e-324 is refused by name), at most max. */
const gtZero = (what: string, max: number, unit: string, floor = 1e-9): z.ZodNumber =>
  numberOf(what)
    .gt(0, { error: `${what} must be above zero` })
    .min(floor, { error: `${what} must be at least ${floor} ${unit}` })
    .max(max, { error: `${what} must be at most ${max} ${unit}` });
/** Zero, or from `floor` to max. */
const atLeastZero = (what: string, max: number, unit: string, floor = 1e-9): z.ZodNumber =>
  numberOf(what)
    .min(0, { error: `${what} cannot be negative` })
    .max(max, { error: `${what} must be at most ${max} ${unit}` })
    .refine((v) => v === 0 || v >= floor, { error: `${what} must be 0 or at least ${floor} ${unit}` });

export const supplyMotorSchema = z
  .object(
    {
      ratedVoltageV: gtZero('Rated voltage', 1000, 'V'),
      noLoadSpeedRpm: gtZero('No-load speed', 1_000_000, 'rpm'),
      noLoadCurrentA: gtZero('No-load current', 1000, 'A'),
      stallCurrentA: gtZero('Stall current', 10_000, 'A'),
      /** Not used by the supply formulas; checked when given. */
      stallTorqueNm: gtZero('Stall torque', 1000, 'N·m').nullish(),
      rotorInertiaKgM2: gtZero('Rotor inertia', 1, 'kg·m²', RANGES.inertiaKgM2.min).nullish(),
    },
    { error: 'motor is required: the datasheet points ratedVoltageV, noLoadSpeedRpm, noLoadCurrentA, stallCurrentA' },
  )
  .superRefine((m, ctx) => {
    if (m.noLoadCurrentA >= m.stallCurrentA)
      ctx.addIssue({ code: 'custom', path: ['noLoadCurrentA'], message: 'No-load current must be below the stall current.' });
  });

const calcSupplyBodySchema = z
  .object(
    {
      motor: supplyMotorSchema,
      supply: z.object(
        {
          voltageV: gtZero('Supply voltage', 1000, 'V'),
          internalResistanceOhm: atLeastZero('Internal resistance', 1_000_000, 'Ω').nullish(),
          continuousCurrentA: gtZero('Continuous current rating', 10_000, 'A').nullish(),
          currentLimitA: gtZero('Current limit', 10_000, 'A').nullish(),
        },
        { error: 'supply is required: at least { voltageV }' },
      ),
      seriesResistanceOhm: atLeastZero('Series resistance', 1_000_000, 'Ω').nullish(),
      windingC: numberOf('Winding temperature')
        .min(-60, { error: 'Winding temperature must be at least −60 °C' })
        .max(200, { error: 'Winding temperature must be at most 200 °C' })
        .nullish(),
      loadTorqueNm: atLeastZero('Load torque', 1000, 'N·m').nullish(),
      logic: z
        .object({
          sharedWithMotor: z.boolean({ error: 'sharedWithMotor is true or false' }).nullish(),
          minSupplyV: gtZero('Controller minimum supply', 1000, 'V').nullish(),
          regulatorDropoutV: atLeastZero('Regulator dropout', 100, 'V').nullish(),
        })
        .nullish(),
      allowedDipV: gtZero('Allowed dip', 1000, 'V').nullish(),
    },
    { error: 'The body is a JSON object with motor and supply' },
  )
  .superRefine((b, ctx) => {
    if (typeof b.allowedDipV === 'number' && typeof b.supply?.voltageV === 'number' && b.allowedDipV >= b.supply.voltageV) {
      ctx.addIssue({ code: 'custom', path: ['allowedDipV'], message: 'The allowed dip must be below the supply voltage.' });
    }
  });
export type CalcSupplyRequest = z.infer<typeof calcSupplyBodySchema>;

// Values inside every bound can still be too extreme to model (a speed so high that Ke underflows): a 400, never a 500.
export const calcSupplyRequestSchema = calcSupplyBodySchema.refine((b) => modelsFinitely(b), {
  path: ['motor'],
  message: 'These motor and supply figures are too extreme to model; check their units.',
  when: (payload) => payload.issues.length === 0,
});

function modelsFinitely(body: CalcSupplyRequest): boolean {
  try {
    const r = calcSupply(body);
    const numbers = [
      r.startCurrentA,
      r.startActualCurrentA,
      r.sourceVoltageAtStartV,
      r.startTorqueNm,
      r.runningCurrentA,
      r.bulkCapacitanceF ?? 0,
    ];
    return numbers.every(Number.isFinite) && r.checks.every((c) => c.value == null || Number.isFinite(c.value));
  } catch {
    return false;
  }
}
