/** zod schema of a design as entered; shared by the workspace form and the designs endpoints. */
import { z } from 'zod';
import { INT_UNSIGNED_MAX, positiveIn, zeroOrIn, type RangeName } from './bounds.ts';

/** Match answers: entries per ranked list by default, and at most. */
export const DEFAULT_MATCH_LIMIT = 25;
export const MAX_MATCH_LIMIT = 500;

const pos = (range: RangeName) => positiveIn(range);
const nonNeg = (range: RangeName) => zeroOrIn(range);
const id = () => z.number().int().positive().max(INT_UNSIGNED_MAX);

const motorParams = z
  .object({
    ratedVoltageV: pos('voltageV'),
    voltageMinV: pos('voltageV').nullable().default(null),
    voltageMaxV: pos('voltageV').nullable().default(null),
    noLoadSpeedRpm: pos('speedRpm'),
    noLoadCurrentA: pos('currentA'),
    stallTorqueNm: pos('torqueNm'),
    stallCurrentA: pos('surgeA'),
    terminalResistanceOhm: pos('resistanceOhm').nullable().default(null),
    inductanceH: pos('inductanceH').nullable().default(null),
    rotorInertiaKgM2: pos('inertiaKgM2').nullable().default(null),
  })
  .refine((m) => m.stallCurrentA > m.noLoadCurrentA, {
    path: ['stallCurrentA'],
    message: 'Stall current must be above the no-load current.',
  });

const selection = z
  .object({
    chosenPartId: id().nullable().default(null),
    alternatePartIds: z.array(id()).max(3, { error: 'At most three alternates.' }).default([]),
  })
  .refine((s) => new Set(s.alternatePartIds).size === s.alternatePartIds.length, {
    path: ['alternatePartIds'],
    message: 'An alternate is listed twice.',
  })
  .refine((s) => s.chosenPartId == null || !s.alternatePartIds.includes(s.chosenPartId), {
    path: ['alternatePartIds'],
    message: 'The chosen part cannot also be an alternate.',
  });

const emptySelection = { chosenPartId: null, alternatePartIds: [] };

export const designInputSchema = z
  .object({
    name: z.string().trim().min(1, { error: 'Give the design a name.' }).max(120),
    motor: z.discriminatedUnion('source', [
      z.object({ source: z.literal('catalogue'), partId: id() }),
      z.object({ source: z.literal('manual'), label: z.string().trim().min(1).max(120), params: motorParams }),
    ]),
    supply: z.object({
      minV: pos('voltageV').max(60),
      nomV: pos('voltageV').max(60),
      maxV: pos('voltageV').max(60),
      preset: z.string().max(40).nullable().default(null),
      internalResistanceOhm: nonNeg('resistanceOhm').max(100).default(0),
      continuousCurrentA: pos('currentA').nullable().default(null),
      currentLimitA: pos('currentA').nullable().default(null),
    }),
    wiringResistanceOhm: nonNeg('resistanceOhm').max(100).default(0),
    shuntResistanceOhm: nonNeg('resistanceOhm').max(100).default(0),
    logic: z.object({
      railV: pos('voltageV').max(15),
      highV: pos('voltageV').max(15),
      lowV: nonNeg('voltageV').max(5),
      pinSourceCurrentA: pos('currentA').max(1),
      pinSinkCurrentA: pos('currentA').max(1),
      resetPull: z.enum(['up', 'down', 'none']),
      resetPullOhms: nonNeg('resistanceOhm').max(10_000_000),
      resetPullTolerance: z.number().min(0).max(0.9),
      sharedSupply: z
        .object({ minSupplyV: pos('voltageV').max(60), regulatorDropoutV: nonNeg('voltageV').max(10).default(0) })
        .nullable()
        .default(null),
    }),
    drive: z.discriminatedUnion('mode', [
      z.object({ mode: z.literal('onoff') }),
      z.object({
        mode: z.literal('pwm'),
        frequencyHz: pos('frequencyHz').max(2_000_000),
        dutyMin: z.number().min(1e-6).max(1),
        dutyMax: z.number().min(1e-6).max(1),
      }),
    ]),
    ambientMinC: z.number().min(-60).max(150),
    ambientMaxC: z.number().min(-60).max(150),
    load: z.discriminatedUnion('kind', [
      z.object({ kind: z.literal('torque'), torqueNm: nonNeg('torqueNm') }),
      z.object({ kind: z.literal('speed'), speedRpm: nonNeg('speedRpm') }),
      z.object({ kind: z.literal('stall-only') }),
    ]),
    margins: z.object({ voltageDerating: z.number().gt(0).max(1).default(0.8), thermalMarginC: z.number().min(0).max(100).default(25) }),
    driverSupplyV: pos('voltageV').max(40).nullable().default(null),
    boardQuantity: z.number().int().min(1).max(1_000_000).default(100),
    stallProtection: z
      .discriminatedUnion('kind', [
        z.object({ kind: z.literal('none') }),
        z.object({ kind: z.literal('current-limit'), limitA: pos('currentA') }),
        z.object({ kind: z.literal('cut-off'), afterS: pos('timeS').max(3600) }),
      ])
      .default({ kind: 'none' }),
    resetStartIntent: z
      .object({ reason: z.string().trim().min(10, { error: 'Say in a sentence why the motor may run at reset.' }).max(500) })
      .nullable()
      .default(null),
    selections: z
      .object({
        switch: selection.default(emptySelection),
        driver: selection.default(emptySelection),
        diode: selection.default(emptySelection),
      })
      .default({ switch: emptySelection, driver: emptySelection, diode: emptySelection }),
  })
  .superRefine((d, ctx) => {
    if (!(d.supply.minV <= d.supply.nomV && d.supply.nomV <= d.supply.maxV)) {
      ctx.addIssue({ code: 'custom', path: ['supply', 'nomV'], message: 'Supply must satisfy minimum ≤ nominal ≤ maximum.' });
    }
    if (d.ambientMinC > d.ambientMaxC)
      ctx.addIssue({ code: 'custom', path: ['ambientMinC'], message: 'Minimum ambient is above the maximum.' });
    if (d.logic.highV > d.logic.railV)
      ctx.addIssue({ code: 'custom', path: ['logic', 'highV'], message: 'Output high cannot exceed the logic rail.' });
    if (d.logic.lowV >= d.logic.highV)
      ctx.addIssue({ code: 'custom', path: ['logic', 'lowV'], message: 'Output low must be below output high.' });
    if (d.logic.resetPull !== 'none' && d.logic.resetPullOhms <= 0) {
      ctx.addIssue({ code: 'custom', path: ['logic', 'resetPullOhms'], message: 'An internal pull needs a resistance above zero.' });
    }
    if (d.drive.mode === 'pwm' && d.drive.dutyMin > d.drive.dutyMax) {
      ctx.addIssue({ code: 'custom', path: ['drive', 'dutyMin'], message: 'Minimum duty is above the maximum duty.' });
    }
  });

export type DesignInputBody = z.input<typeof designInputSchema>;
export type ParsedDesignInput = z.output<typeof designInputSchema>;

/**
 * The body of both match routes: `input` ranks that input (unsaved edits); without it, the saved
 * revision (`revision`, default the current one) of the design named in the path is ranked.
 */
export const matchRequestSchema = z.object({
  includePending: z.boolean().default(false),
  input: designInputSchema.optional(),
  revision: z.number().int().min(1).max(INT_UNSIGNED_MAX).optional(),
  /** Entries per ranked list in the answer (the best first) and where the page starts; counts cover all. */
  limit: z.number({ error: 'limit must be a whole number' }).int().min(1).max(MAX_MATCH_LIMIT).default(DEFAULT_MATCH_LIMIT),
  offset: z.number({ error: 'offset must be a whole number' }).int().min(0).max(INT_UNSIGNED_MAX).default(0),
});
export type MatchRequest = z.output<typeof matchRequestSchema>;

/** The query of GET /api/designs/:id/compare: one role, 1–4 part ids ("3,7,12"), pending parts on request. */
export const compareQuerySchema = z.object({
  role: z.enum(['switch', 'driver', 'diode'], { error: 'role must be switch, driver or diode' }),
  ids: z
    .string({ error: 'ids must list 1 to 4 part ids, e.g. ids=3,7' })
    .min(1, 'ids must list 1 to 4 part ids, e.g. ids=3,7')
    .transform((raw) => raw.split(',').map((x) => x.trim()))
    .pipe(
      z
        .array(z.string().regex(/^[1-9]\d{0,9}$/, 'each id must be a whole number from 1'))
        .min(1, 'ids must list 1 to 4 part ids')
        .max(4, 'ids must list at most 4 part ids'),
    )
    .transform((list) => [...new Set(list.map(Number))]),
  includePending: z
    .enum(['true', 'false'], { error: 'includePending must be true or false' })
    .default('false')
    .transform((v) => v === 'true'),
});
export type CompareQuery = z.output<typeof compareQuerySchema>;
