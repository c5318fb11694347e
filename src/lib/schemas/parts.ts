/**
 * Part schemas shared by the forms (islands) and the endpoints: create/edit, review, lifecycle, supply
 * data and the list query. Pure: zod and domain constants only. Field names carry their units.
 */
import { z } from 'zod';
import { LIFECYCLES, PART_CATEGORIES, REVIEW_STATUSES } from '../domain/parts.ts';
import { countIn, INT_UNSIGNED_MAX, positiveIn, zeroOrIn, type RangeName } from './bounds.ts';
import type { PartChangeGroup } from '../part-diff.ts';

const num = (label: string) => z.number({ error: `${label} must be a number` }).finite();
const pos = (label: string, range: RangeName) => positiveIn(range, label);
const nonNeg = (label: string, range: RangeName) => zeroOrIn(range, label);
const optPos = (label: string, range: RangeName) => pos(label, range).nullable().default(null);

export const isoDateSchema = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, { error: 'Use a date like 2026-12-31' })
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), {
    error: 'Not a calendar date',
  });

const text = (label: string, max: number) =>
  z
    .string({ error: `${label} is required` })
    .trim()
    .min(1, { error: `${label} is required` })
    .max(max, { error: `${label}: at most ${max} characters` });

/** Part numbers: letters, digits and the separators makers print. */
export const mpnSchema = text('Part number', 80).regex(/^[A-Za-z0-9][A-Za-z0-9._\-/+#]*$/, {
  error: 'Part number: letters, digits and . _ - / + # only, starting with a letter or digit',
});

export const zthPointSchema = z.object({
  pulseS: pos('Zth pulse length', 'timeS').max(10_000),
  zthCPerW: pos('Zth', 'thermalCPerW'),
});

export const rdsOnPointSchema = z.object({
  vgsV: pos('VGS', 'voltageV'),
  tjC: num('Tj').min(-55).max(200).default(25),
  maxOhm: pos('RDS(on) max', 'resistanceOhm'),
  typOhm: optPos('RDS(on) typ', 'resistanceOhm'),
  idA: optPos('ID', 'currentA'),
});

export const mosfetParamsSchema = z
  .object({
    channel: z.enum(['n', 'p'], { error: 'Channel is n or p' }),
    vdsMaxV: pos('VDS max', 'ratingV'),
    vgsMaxV: pos('VGS max', 'voltageV'),
    vgsThMinV: pos('VGS(th) min', 'voltageV'),
    vgsThMaxV: pos('VGS(th) max', 'voltageV'),
    vgsThTestCurrentA: pos('VGS(th) test current', 'currentA').default(0.00025),
    idContinuousA: pos('ID continuous', 'currentA'),
    idPulsedA: pos('ID pulsed', 'surgeA'),
    qgTotalNc: pos('Qg', 'chargeNc'),
    qgTestVgsV: pos('Qg test VGS', 'voltageV'),
    qgsNc: optPos('Qgs', 'chargeNc'),
    qgdNc: optPos('Qgd', 'chargeNc'),
    vPlateauV: optPos('Plateau voltage', 'voltageV'),
    rthJaCPerW: pos('RθJA', 'thermalCPerW'),
    tjMaxC: num('Tj max').min(25).max(250),
    bodyDiodeVfV: optPos('Body-diode VF', 'voltageV'),
    rdsOn: z.array(rdsOnPointSchema).min(1, { error: 'Give at least one RDS(on) line with its VGS' }).max(8),
    zthPoints: z.array(zthPointSchema).max(12).default([]),
  })
  .superRefine((p, ctx) => {
    if (p.vgsThMinV > p.vgsThMaxV) ctx.addIssue({ code: 'custom', path: ['vgsThMinV'], message: 'VGS(th) min is above VGS(th) max' });
    if (p.vgsThMaxV >= p.vgsMaxV) ctx.addIssue({ code: 'custom', path: ['vgsThMaxV'], message: 'VGS(th) max must be below VGS max' });
    if (p.idPulsedA < p.idContinuousA)
      ctx.addIssue({ code: 'custom', path: ['idPulsedA'], message: 'Pulsed current is below the continuous current' });
    const seen = new Set<string>();
    p.rdsOn.forEach((r, i) => {
      const key = `${r.vgsV}@${r.tjC}`;
      if (seen.has(key)) ctx.addIssue({ code: 'custom', path: ['rdsOn', i, 'vgsV'], message: 'Two RDS(on) lines at the same VGS and Tj' });
      seen.add(key);
      if (r.vgsV > p.vgsMaxV) ctx.addIssue({ code: 'custom', path: ['rdsOn', i, 'vgsV'], message: 'RDS(on) line above VGS max' });
      if (r.typOhm !== null && r.typOhm > r.maxOhm)
        ctx.addIssue({ code: 'custom', path: ['rdsOn', i, 'typOhm'], message: 'Typical above maximum' });
    });
    zthPointIssues(p.zthPoints, p.rthJaCPerW).forEach((issue) =>
      ctx.addIssue({ code: 'custom', ...issue, path: ['zthPoints', ...issue.path] }),
    );
  });

/**
 * A single-pulse Zth curve read off a datasheet: pulses in ascending order (each length once), the
 * impedance never falling as the pulse lengthens, and never above the steady-state RθJA it tends to.
 */
export function zthPointIssues(
  points: { pulseS: number; zthCPerW: number }[],
  rthJaCPerW: number,
): { path: (string | number)[]; message: string }[] {
  const issues: { path: (string | number)[]; message: string }[] = [];
  points.forEach((z, i) => {
    const prev = points[i - 1];
    if (prev && z.pulseS <= prev.pulseS)
      issues.push({ path: [i, 'pulseS'], message: 'List the pulses in ascending order, each length once' });
    else if (prev && z.zthCPerW < prev.zthCPerW)
      issues.push({ path: [i, 'zthCPerW'], message: 'Zth is below the shorter pulse before it: a single-pulse curve only rises' });
    if (Number.isFinite(rthJaCPerW) && z.zthCPerW > rthJaCPerW)
      issues.push({ path: [i, 'zthCPerW'], message: `Zth is above RθJA (${rthJaCPerW} K/W), the value it tends to for long pulses` });
  });
  return issues;
}

export const driverParamsSchema = z
  .object({
    kind: z.enum(['gate-driver', 'level-shifter'], { error: 'Kind is gate-driver or level-shifter' }),
    channels: z.number({ error: 'Channels must be a number' }).int().min(1).max(8),
    inverting: z.boolean({ error: 'Inverting is true or false' }),
    supplyMinV: pos('Supply min', 'voltageV'),
    supplyMaxV: pos('Supply max', 'voltageV'),
    inputLogic: z.enum(['fixed', 'ratio', 'input-rail'], { error: 'Input logic is fixed, ratio or input-rail' }),
    inputHighMin: pos('VIH min', 'voltageV'),
    inputLowMax: nonNeg('VIL max', 'voltageV'),
    outputHighDropV: nonNeg('Output high drop', 'voltageV'),
    outputLowMaxV: nonNeg('VOL max', 'voltageV'),
    sourceCurrentA: pos('Source current', 'currentA'),
    sinkCurrentA: pos('Sink current', 'currentA'),
    propagationDelayNs: pos('Propagation delay', 'timeNs'),
    inputPull: z.enum(['up', 'down', 'none'], { error: 'Input pull is up, down or none' }),
    inputPullOhms: optPos('Input pull resistance', 'resistanceOhm'),
  })
  .superRefine((p, ctx) => {
    if (p.supplyMinV > p.supplyMaxV) ctx.addIssue({ code: 'custom', path: ['supplyMinV'], message: 'Supply min is above supply max' });
    if (p.inputLowMax >= p.inputHighMin) ctx.addIssue({ code: 'custom', path: ['inputLowMax'], message: 'VIL max must be below VIH min' });
    if (p.inputLogic !== 'fixed' && p.inputHighMin > 1) {
      ctx.addIssue({ code: 'custom', path: ['inputHighMin'], message: 'For ratio inputs give VIH as a fraction of the rail (0–1)' });
    }
  });

export const diodeParamsSchema = z.object({
  kind: z.enum(['schottky', 'ultrafast', 'fast', 'general'], { error: 'Kind is schottky, ultrafast, fast or general' }),
  vrrmV: pos('VRRM', 'ratingV'),
  ifAvA: pos('IF(AV)', 'currentA'),
  ifsmA: pos('IFSM', 'surgeA'),
  vfV: pos('VF', 'voltageV'),
  vfAtIfA: pos('VF test current', 'currentA'),
  trrNs: optPos('trr', 'timeNs'),
  ifrmA: optPos('IFRM', 'surgeA'),
  rthJaCPerW: optPos('RθJA', 'thermalCPerW'),
  tjMaxC: num('Tj max').min(25, { error: 'Tj max: at least 25 °C' }).max(250, { error: 'Tj max: at most 250 °C' }).nullable().default(null),
});

export const motorParamsSchema = z
  .object({
    ratedVoltageV: pos('Rated voltage', 'voltageV'),
    voltageMinV: optPos('Voltage min', 'voltageV'),
    voltageMaxV: optPos('Voltage max', 'voltageV'),
    noLoadSpeedRpm: pos('No-load speed', 'speedRpm'),
    noLoadCurrentA: pos('No-load current', 'currentA'),
    stallTorqueNm: pos('Stall torque', 'torqueNm'),
    stallCurrentA: pos('Stall current', 'surgeA'),
    terminalResistanceOhm: optPos('Terminal resistance', 'resistanceOhm'),
    inductanceH: optPos('Inductance', 'inductanceH'),
    rotorInertiaKgM2: optPos('Rotor inertia', 'inertiaKgM2'),
  })
  .superRefine((p, ctx) => {
    if (p.noLoadCurrentA >= p.stallCurrentA)
      ctx.addIssue({ code: 'custom', path: ['noLoadCurrentA'], message: 'No-load current must be below the stall current' });
    if (p.voltageMinV !== null && p.voltageMinV > p.ratedVoltageV)
      ctx.addIssue({ code: 'custom', path: ['voltageMinV'], message: 'Voltage min is above the rated voltage' });
    if (p.voltageMaxV !== null && p.voltageMaxV < p.ratedVoltageV)
      ctx.addIssue({ code: 'custom', path: ['voltageMaxV'], message: 'Voltage max is below the rated voltage' });
  });

export const priceBreakSchema = z.object({
  qty: countIn(1, 'Quantity'),
  // DECIMAL(12,5): a sixth decimal would be rounded away on save, so it is refused instead of changed silently.
  unitPrice: pos('Unit price', 'unitPrice').refine((v) => Math.abs(v * 1e5 - Math.round(v * 1e5)) < 1e-6, {
    error: 'Unit price: at most 5 decimals',
  }),
});

/**
 * ISO 4217 codes the runtime knows (Intl, the same list in the browser and on the server), so a typo such as
 * "EUO" is refused at the field; the rates table's currencies are all among them.
 */
const ISO_4217: ReadonlySet<string> = new Set(typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('currency') : []);
export const isIsoCurrency = (code: string): boolean => /^[A-Z]{3}$/.test(code) && (ISO_4217.size === 0 || ISO_4217.has(code));

export const currencyCodeSchema = z
  .string({ error: 'Currency is a three-letter ISO 4217 code such as EUR' })
  .regex(/^[A-Z]{3}$/, { error: 'Currency is a three-letter ISO 4217 code in capitals', abort: true })
  .refine(isIsoCurrency, { error: 'Currency is not an ISO 4217 code (use one such as EUR, USD, GBP)' });

/** Lead time: whole days, at most 1000 (about three years; the column is INT UNSIGNED). */
export const MAX_LEAD_TIME_DAYS = 1000;

export const partSourceSchema = z
  .object({
    distributor: text('Distributor', 120),
    sku: text('SKU', 80),
    moq: countIn(1, 'MOQ').default(1),
    orderMultiple: countIn(1, 'Order multiple').default(1),
    leadTimeDays: countIn(0, 'Lead time (days)', MAX_LEAD_TIME_DAYS).default(0),
    stockQty: countIn(0, 'Stock').default(0),
    currency: currencyCodeSchema.default('USD'),
    priceBreaks: z.array(priceBreakSchema).max(12, { error: 'At most 12 price breaks per source' }).default([]),
  })
  .superRefine((s, ctx) => {
    // Breaks climb in quantity: each one starts above the one before it (the price at a quantity is the last break at or below it).
    s.priceBreaks.forEach((b, i) => {
      const prev = s.priceBreaks[i - 1];
      if (prev && b.qty <= prev.qty)
        ctx.addIssue({
          code: 'custom',
          path: ['priceBreaks', i, 'qty'],
          message:
            b.qty === prev.qty
              ? `Two price breaks at the same quantity (${b.qty})`
              : `Price breaks go up in quantity: ${b.qty} comes after ${prev.qty}`,
        });
    });
    const first = s.priceBreaks[0];
    if (first && s.moq > first.qty)
      ctx.addIssue({
        code: 'custom',
        path: ['moq'],
        message: `MOQ ${s.moq} is above the first price break (${first.qty}): nobody can buy ${first.qty}. Lower the MOQ or start the breaks at ${s.moq}`,
      });
  });

export const sourcesSchema = z
  .array(partSourceSchema)
  .max(20)
  .superRefine((list, ctx) => {
    const keys = list.map((s) => `${s.distributor}|${s.sku}`);
    keys.forEach((k, i) => {
      if (keys.indexOf(k) !== i) ctx.addIssue({ code: 'custom', path: [i, 'sku'], message: 'The same distributor and SKU twice' });
    });
  });

/** Review status a creator may ask for; the service decides what a role actually gets. */
export const REQUESTABLE_REVIEW_STATUSES = ['draft', 'pending', 'approved'] as const;

const headShape = {
  manufacturer: text('Maker', 120),
  mpn: mpnSchema,
  description: z.string().trim().max(500, { error: 'Description: at most 500 characters' }).default(''),
  package: z.string().trim().max(40, { error: 'Package: at most 40 characters' }).default(''),
  lifecycle: z.enum(LIFECYCLES, { error: 'Lifecycle is active, nrnd, last-buy or obsolete' }).default('active'),
  lifecycleEffectiveDate: isoDateSchema.nullable().default(null),
  reviewStatus: z.enum(REQUESTABLE_REVIEW_STATUSES, { error: 'Review status is draft, pending or approved' }).optional(),
  sources: sourcesSchema.optional(),
};

/** A part as the form and POST /api/parts send it (category picks the parameter schema). */
export const partInputSchema = z.discriminatedUnion(
  'category',
  [
    z.object({ category: z.literal('mosfet'), ...headShape, params: mosfetParamsSchema }),
    z.object({ category: z.literal('driver'), ...headShape, params: driverParamsSchema }),
    z.object({ category: z.literal('diode'), ...headShape, params: diodeParamsSchema }),
    z.object({ category: z.literal('motor'), ...headShape, params: motorParamsSchema }),
  ],
  { error: 'Category is motor, mosfet, driver or diode' },
);
export type PartInput = z.infer<typeof partInputSchema>;

const versionSchema = z.number({ error: 'version is required (the version you loaded)' }).int().min(1).max(INT_UNSIGNED_MAX);

/** PUT /api/parts/:id: the whole record as loaded, with the version it was loaded at. */
export const partUpdateSchema = z.intersection(partInputSchema, z.object({ version: versionSchema }));
export type PartUpdate = z.infer<typeof partUpdateSchema>;

/** A review decision; the reason a rejection needs is checked by the service (reviewPart), which says what to do. */
export const reviewDecisionSchema = z.object({
  decision: z.enum(['approve', 'reject'], { error: 'Decision is approve or reject' }),
  reason: z.string().trim().max(500).default(''),
  version: versionSchema,
});
export type ReviewDecision = z.infer<typeof reviewDecisionSchema>;

export const lifecycleChangeSchema = z.object({
  lifecycle: z.enum(LIFECYCLES, { error: 'Lifecycle is active, nrnd, last-buy or obsolete' }),
  effectiveDate: isoDateSchema,
  note: z.string().trim().min(3, { error: 'Add a note: the notice, the reason or the replacement' }).max(500),
  version: versionSchema,
});
export type LifecycleChange = z.infer<typeof lifecycleChangeSchema>;

export const sourcesUpdateSchema = z.object({ sources: sourcesSchema, version: versionSchema });
export type SourcesUpdate = z.infer<typeof sourcesUpdateSchema>;

/** The datasheet upload's "confirm" form field: "true" attaches a file whose text does not fit the part. */
export const datasheetConfirmSchema = z.enum(['true', 'false', '']);

export const datasheetRevisionSchema = z
  .string()
  .trim()
  .max(40, { error: 'Revision: at most 40 characters' })
  .regex(/^[\p{L}\p{N} ._\-/()]*$/u, { error: 'Revision: letters, digits, spaces and . _ - / ( ) only' });

export { PART_CATEGORIES, LIFECYCLES, REVIEW_STATUSES };

/* ---------- GET /api/parts: the list query (from URL search parameters) ---------- */

/** Which category each parameter filter belongs to (a filter implies its category). */
export const FILTER_CATEGORY = {
  vdsMinV: 'mosfet',
  vgsThMaxV: 'mosfet',
  rdsOnMaxOhm: 'mosfet',
  rdsOnAtVgsV: 'mosfet',
  idMinA: 'mosfet',
  qgMaxNc: 'mosfet',
  channel: 'mosfet',
  logicRailV: 'driver',
  outputHighMinV: 'driver',
  supplyV: 'driver',
  inverting: 'driver',
  kind: 'diode',
  vrrmMinV: 'diode',
  ifAvMinA: 'diode',
  trrMaxNs: 'diode',
  ratedVoltageMinV: 'motor',
  ratedVoltageMaxV: 'motor',
  noLoadSpeedMinRpm: 'motor',
  stallTorqueMinNm: 'motor',
} as const;
export type ParamFilterKey = keyof typeof FILTER_CATEGORY;

/** Sort keys: common ones, and per category the typed columns. Prefix "-" for descending. */
export const COMMON_SORT_KEYS = ['mpn', 'manufacturer', 'package', 'lifecycle', 'reviewStatus', 'updatedAt'] as const;
export const CATEGORY_SORT_KEYS = {
  mosfet: ['vdsMaxV', 'vgsThMaxV', 'idContinuousA', 'qgTotalNc', 'rthJaCPerW', 'minRdsOnVgsV'],
  driver: ['supplyMinV', 'supplyMaxV', 'sourceCurrentA', 'propagationDelayNs'],
  diode: ['vrrmV', 'ifAvA', 'vfV', 'trrNs'],
  motor: ['ratedVoltageV', 'noLoadSpeedRpm', 'stallTorqueNm', 'stallCurrentA'],
} as const;

export const MAX_PAGE_SIZE = 200;

const blankToUndefined = (v: unknown): unknown => (typeof v === 'string' && v.trim() === '' ? undefined : v);
const qNum = (label: string, min = 0) =>
  z.preprocess(
    blankToUndefined,
    z.coerce
      .number({ error: `${label} must be a number` })
      .refine(Number.isFinite, { error: `${label} must be a number` })
      .refine((n) => n >= min, { error: `${label} cannot be below ${min}` })
      .optional(),
  );
const qList = <T extends readonly [string, ...string[]]>(values: T, label: string) =>
  z.preprocess(
    (v) => (typeof v === 'string' && v.trim() !== '' ? v.split(',').map((s) => s.trim()) : undefined),
    z.array(z.enum(values, { error: `${label}: one of ${values.join(', ')}` })).optional(),
  );

export const partListQuerySchema = z
  .strictObject(
    {
      category: z.preprocess(blankToUndefined, z.enum(PART_CATEGORIES, { error: 'Category is motor, mosfet, driver or diode' }).optional()),
      q: z.preprocess(blankToUndefined, z.string().trim().max(100, { error: 'Search text: at most 100 characters' }).optional()),
      units: z.preprocess(blankToUndefined, z.enum(['on', 'off'], { error: 'Units in the search text: on or off' }).optional()),
      page: z.preprocess(
        blankToUndefined,
        z.coerce
          .number({ error: 'page must be a whole number' })
          .int({ error: 'page must be a whole number' })
          .min(1)
          .max(100000)
          .default(1),
      ),
      pageSize: z.preprocess(
        blankToUndefined,
        z.coerce
          .number({ error: 'pageSize must be a whole number' })
          .int({ error: 'pageSize must be a whole number' })
          .min(1)
          .max(MAX_PAGE_SIZE)
          .default(25),
      ),
      sort: z.preprocess(
        blankToUndefined,
        z
          .string()
          .regex(/^-?[A-Za-z]+$/, { error: 'sort is a field name, "-" in front for descending' })
          .optional(),
      ),
      format: z.preprocess(blankToUndefined, z.enum(['json', 'csv'], { error: 'format is json or csv' }).optional()),
      lifecycle: qList(LIFECYCLES, 'lifecycle'),
      reviewStatus: qList(REVIEW_STATUSES, 'reviewStatus'),
      package: z.preprocess(blankToUndefined, z.string().trim().max(40).optional()),
      vdsMinV: qNum('vdsMinV'),
      vgsThMaxV: qNum('vgsThMaxV'),
      rdsOnMaxOhm: qNum('rdsOnMaxOhm'),
      rdsOnAtVgsV: qNum('rdsOnAtVgsV'),
      idMinA: qNum('idMinA'),
      qgMaxNc: qNum('qgMaxNc'),
      channel: z.preprocess(blankToUndefined, z.enum(['n', 'p'], { error: 'channel is n or p' }).optional()),
      logicRailV: qNum('logicRailV'),
      outputHighMinV: qNum('outputHighMinV'),
      supplyV: qNum('supplyV'),
      inverting: z.preprocess(
        blankToUndefined,
        z
          .enum(['true', 'false'], { error: 'inverting is true or false' })
          .transform((s) => s === 'true')
          .optional(),
      ),
      kind: z.preprocess(
        blankToUndefined,
        z.enum(['schottky', 'ultrafast', 'fast', 'general'], { error: 'kind is schottky, ultrafast, fast or general' }).optional(),
      ),
      vrrmMinV: qNum('vrrmMinV'),
      ifAvMinA: qNum('ifAvMinA'),
      trrMaxNs: qNum('trrMaxNs'),
      ratedVoltageMinV: qNum('ratedVoltageMinV'),
      ratedVoltageMaxV: qNum('ratedVoltageMaxV'),
      noLoadSpeedMinRpm: qNum('noLoadSpeedMinRpm'),
      stallTorqueMinNm: qNum('stallTorqueMinNm'),
    },
    { error: (iss) => (iss.code === 'unrecognized_keys' ? `Unknown filter: ${iss.keys.join(', ')}` : undefined) },
  )
  .superRefine((query, ctx) => {
    for (const [key, category] of Object.entries(FILTER_CATEGORY)) {
      if (query[key as ParamFilterKey] === undefined) continue;
      if (query.category && query.category !== category) {
        ctx.addIssue({ code: 'custom', path: [key], message: `${key} filters ${category} parts, not ${query.category}` });
      }
    }
    if (query.rdsOnMaxOhm !== undefined && query.rdsOnAtVgsV === undefined) {
      ctx.addIssue({ code: 'custom', path: ['rdsOnAtVgsV'], message: 'Give the gate drive (rdsOnAtVgsV) the RDS(on) bound applies at' });
    }
    if (query.sort) {
      const key = query.sort.replace(/^-/, '');
      const category = query.category ?? inferCategory(query);
      const allowed: readonly string[] = [...COMMON_SORT_KEYS, ...(category ? CATEGORY_SORT_KEYS[category] : [])];
      if (!allowed.includes(key))
        ctx.addIssue({ code: 'custom', path: ['sort'], message: `Cannot sort by ${key}; choose one of ${allowed.join(', ')}` });
    }
  })
  .transform((query) => ({ ...query, category: query.category ?? inferCategory(query) }));
export type PartListQuery = z.infer<typeof partListQuerySchema>;

function inferCategory(query: Partial<Record<ParamFilterKey, unknown>>): (typeof PART_CATEGORIES)[number] | undefined {
  for (const [key, category] of Object.entries(FILTER_CATEGORY)) {
    if (query[key as ParamFilterKey] !== undefined) return category;
  }
  return undefined;
}

/** A page of the list as GET /api/parts answers it. */
export interface PartListPage<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

/* ---------- What the part page and its islands receive (never raw rows) ---------- */

export interface DatasheetView {
  id: number;
  originalName: string;
  bytes: number;
  pages: number;
  revision: string | null;
  sha256: string;
  uploadedBy: string | null;
  uploadedAt: string;
}

export interface HistoryChange {
  field: string;
  before: string;
  after: string;
}

export interface HistoryEntry {
  id: number;
  occurredAt: string;
  actor: string | null;
  action: string;
  /** The change in words, grouped (record, parameters, sources), for the part page (src/lib/part-diff.ts). */
  groups: PartChangeGroup[];
  note: string | null;
  changes: HistoryChange[];
}

/** Flattens two states to dotted paths and lists what differs (the history's "before → after"). */
export function diffStates(before: unknown, after: unknown, ignore: readonly string[] = ['version', 'id']): HistoryChange[] {
  const flat = (value: unknown, prefix: string, out: Map<string, string>): Map<string, string> => {
    if (value !== null && typeof value === 'object') {
      for (const [k, v] of Object.entries(value as Record<string, unknown>)) {
        if (!prefix && ignore.includes(k)) continue;
        if (k === 'id' && prefix) continue;
        flat(v, prefix ? `${prefix}.${k}` : k, out);
      }
    } else if (prefix) {
      out.set(prefix, value === null || value === undefined ? '—' : String(value));
    }
    return out;
  };
  const a = flat(before, '', new Map());
  const b = flat(after, '', new Map());
  const fields = [...new Set([...a.keys(), ...b.keys()])];
  return fields.filter((f) => a.get(f) !== b.get(f)).map((f) => ({ field: f, before: a.get(f) ?? '—', after: b.get(f) ?? '—' }));
}
