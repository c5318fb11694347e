/** zod schema of a design as entered; shared by the workspace form and the designs endpoints. */
import { z } from 'zod';

/** Match answers: entries per ranked list by default, and at most. */
export const DEFAULT_MATCH_LIMIT = 25;
export const MAX_MATCH_LIMIT = 500;

const pos = () => z.number().positive();
const nonNeg = () => z.number().nonnegative();
const id = () => z.number().int().positive();

const motorParams = z
  .object({
    ratedVoltageV: pos(),
    voltageMinV: pos().nullable().default(null),
    voltageMaxV: pos().nullable().default(null),
    noLoadSpeedRpm: pos(),
    noLoadCurrentA: pos(),
    stallTorqueNm: pos(),
    stallCurrentA: pos(),
    terminalResistanceOhm: pos().nullable().default(null),
    inductanceH: pos().nullable().default(null),
    rotorInertiaKgM2: pos().nullable().default(null),
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
      minV: pos().max(60),
      nomV: pos().max(60),
      maxV: pos().max(60),
      preset: z.string().max(40).nullable().default(null),
      internalResistanceOhm: nonNeg().max(100).default(0),
      continuousCurrentA: pos().max(1000).nullable().default(null),
      currentLimitA: pos().max(1000).nullable().default(null),
    }),
    wiringResistanceOhm: nonNeg().max(100).default(0),
    shuntResistanceOhm: nonNeg().max(100).default(0),
    logic: z.object({
      railV: pos().max(15),
      highV: pos().max(15),
      lowV: nonNeg().max(5),
      pinSourceCurrentA: pos().max(1),
      pinSinkCurrentA: pos().max(1),
      resetPull: z.enum(['up', 'down', 'none']),
      resetPullOhms: nonNeg().max(10_000_000),
      resetPullTolerance: nonNeg().max(0.9),
      sharedSupply: z
        .object({ minSupplyV: pos().max(60), regulatorDropoutV: nonNeg().max(10).default(0) })
        .nullable()
        .default(null),
    }),
    drive: z.discriminatedUnion('mode', [
      z.object({ mode: z.literal('onoff') }),
      z.object({
        mode: z.literal('pwm'),
        frequencyHz: pos().max(2_000_000),
        dutyMin: z.number().gt(0).max(1),
        dutyMax: z.number().gt(0).max(1),
      }),
    ]),
    ambientMinC: z.number().min(-60).max(150),
    ambientMaxC: z.number().min(-60).max(150),
    load: z.discriminatedUnion('kind', [
      z.object({ kind: z.literal('torque'), torqueNm: nonNeg() }),
      z.object({ kind: z.literal('speed'), speedRpm: nonNeg() }),
      z.object({ kind: z.literal('stall-only') }),
    ]),
    margins: z.object({ voltageDerating: z.number().gt(0).max(1).default(0.8), thermalMarginC: nonNeg().max(100).default(25) }),
    driverSupplyV: pos().max(40).nullable().default(null),
    boardQuantity: z.number().int().min(1).max(1_000_000).default(100),
    stallProtection: z
      .discriminatedUnion('kind', [
        z.object({ kind: z.literal('none') }),
        z.object({ kind: z.literal('current-limit'), limitA: pos().max(1000) }),
        z.object({ kind: z.literal('cut-off'), afterS: pos().max(3600) }),
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
  revision: z.number().int().min(1).optional(),
  /** Entries per ranked list in the answer (the best first) and where the page starts; counts cover all. */
  limit: z.number({ error: 'limit must be a whole number' }).int().min(1).max(MAX_MATCH_LIMIT).default(DEFAULT_MATCH_LIMIT),
  offset: z.number({ error: 'offset must be a whole number' }).int().min(0).default(0),
});
export type MatchRequest = z.output<typeof matchRequestSchema>;
