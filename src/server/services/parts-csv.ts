/**
 * The catalogue CSV format, used by both import and export (README "CSV import and export").
 * One part per row; column names carry units; columns that do not apply to a row's category stay empty.
 */
import type { Part, PartCategory } from '../../lib/domain/parts.ts';
import { restoreFormulaText } from '../../lib/csv.ts';

export const RDS_ON_POINTS_IN_CSV = 4;
const RDS_FIELDS = ['VgsV', 'MaxOhm', 'TypOhm', 'IdA', 'TjC'] as const;
const RDS_KEYS: Record<(typeof RDS_FIELDS)[number], string> = { VgsV: 'vgsV', MaxOhm: 'maxOhm', TypOhm: 'typOhm', IdA: 'idA', TjC: 'tjC' };

/**
 * Single-pulse Zth points per row: six pairs, one per decade from 1 ms to 100 s as datasheet curves are
 * read, so an exported curve imports again whole.
 */
export const ZTH_POINTS_IN_CSV = 6;
const ZTH_FIELDS = ['PulseS', 'CPerW'] as const;
const ZTH_KEYS: Record<(typeof ZTH_FIELDS)[number], string> = { PulseS: 'pulseS', CPerW: 'zthCPerW' };

export const HEAD_COLUMNS = [
  'category',
  'manufacturer',
  'mpn',
  'description',
  'package',
  'lifecycle',
  'lifecycleEffectiveDate',
  'reviewStatus',
] as const;
const rdsColumns = Array.from({ length: RDS_ON_POINTS_IN_CSV }, (_, i) => RDS_FIELDS.map((f) => `rdsOn${i + 1}${f}`)).flat();
const zthColumns = Array.from({ length: ZTH_POINTS_IN_CSV }, (_, i) => ZTH_FIELDS.map((f) => `zth${i + 1}${f}`)).flat();

export const CATEGORY_COLUMNS: Record<PartCategory, readonly string[]> = {
  mosfet: [
    'channel',
    'vdsMaxV',
    'vgsMaxV',
    'vgsThMinV',
    'vgsThMaxV',
    'vgsThTestCurrentA',
    'idContinuousA',
    'idPulsedA',
    'qgTotalNc',
    'qgTestVgsV',
    'qgsNc',
    'qgdNc',
    'vPlateauV',
    'rthJaCPerW',
    'tjMaxC',
    'bodyDiodeVfV',
    ...rdsColumns,
    ...zthColumns,
  ],
  driver: [
    'kind',
    'channels',
    'inverting',
    'supplyMinV',
    'supplyMaxV',
    'inputLogic',
    'inputHighMin',
    'inputLowMax',
    'outputHighDropV',
    'outputLowMaxV',
    'sourceCurrentA',
    'sinkCurrentA',
    'propagationDelayNs',
    'inputPull',
    'inputPullOhms',
  ],
  diode: ['kind', 'vrrmV', 'ifAvA', 'ifsmA', 'vfV', 'vfAtIfA', 'trrNs', 'ifrmA', 'rthJaCPerW', 'tjMaxC'],
  motor: [
    'ratedVoltageV',
    'voltageMinV',
    'voltageMaxV',
    'noLoadSpeedRpm',
    'noLoadCurrentA',
    'stallTorqueNm',
    'stallCurrentA',
    'terminalResistanceOhm',
    'inductanceH',
    'rotorInertiaKgM2',
  ],
};
export const SOURCE_COLUMNS = [
  'distributor',
  'sku',
  'moq',
  'orderMultiple',
  'leadTimeDays',
  'stockQty',
  'currency',
  'priceBreaks',
] as const;

/** Every column, in file order (a column shared by categories, such as kind, appears once). */
export const CSV_COLUMNS: string[] = [...new Set([...HEAD_COLUMNS, ...Object.values(CATEGORY_COLUMNS).flat(), ...SOURCE_COLUMNS])];

const TEXT_COLUMNS = new Set([
  'category',
  'manufacturer',
  'mpn',
  'description',
  'package',
  'lifecycle',
  'lifecycleEffectiveDate',
  'reviewStatus',
  'channel',
  'kind',
  'inputLogic',
  'inputPull',
  'distributor',
  'sku',
  'currency',
  'priceBreaks',
  'inverting',
]);

const cell = (v: unknown): string => (v === null || v === undefined ? '' : String(v));

/** One part as a CSV record (its first source only: the format carries one source per row). */
export function partToCsvRow(part: Part): Record<string, string> {
  const row: Record<string, string> = Object.fromEntries(CSV_COLUMNS.map((c) => [c, '']));
  for (const c of HEAD_COLUMNS) row[c] = cell((part as unknown as Record<string, unknown>)[c]);
  const params = part.params as unknown as Record<string, unknown>;
  for (const c of CATEGORY_COLUMNS[part.category]) if (c in params) row[c] = cell(params[c]);
  if (part.category === 'mosfet') {
    part.params.rdsOn.slice(0, RDS_ON_POINTS_IN_CSV).forEach((p, i) => {
      for (const f of RDS_FIELDS) row[`rdsOn${i + 1}${f}`] = cell((p as unknown as Record<string, unknown>)[RDS_KEYS[f]]);
    });
    part.params.zthPoints.slice(0, ZTH_POINTS_IN_CSV).forEach((z, i) => {
      row[`zth${i + 1}PulseS`] = cell(z.pulseS);
      row[`zth${i + 1}CPerW`] = cell(z.zthCPerW);
    });
  }
  const source = part.sources[0];
  if (source) {
    for (const c of SOURCE_COLUMNS) if (c !== 'priceBreaks') row[c] = cell((source as unknown as Record<string, unknown>)[c]);
    row.priceBreaks = source.priceBreaks.map((b) => `${b.qty}:${b.unitPrice}`).join(';');
  }
  return row;
}

export interface CellError {
  column: string;
  message: string;
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

function readValue(column: string, raw: string, errors: CellError[]): unknown {
  if (column === 'inverting') {
    if (raw === 'true' || raw === 'false') return raw === 'true';
    errors.push({ column, message: 'write true or false' });
    return undefined;
  }
  if (TEXT_COLUMNS.has(column)) return raw;
  if (!NUMBER.test(raw)) {
    errors.push({ column, message: `"${raw.slice(0, 20)}" is not a number (use a dot for decimals, no units)` });
    return undefined;
  }
  return Number(raw);
}

function readPriceBreaks(raw: string, errors: CellError[]): { qty: number; unitPrice: number }[] | undefined {
  const out: { qty: number; unitPrice: number }[] = [];
  for (const entry of raw
    .split(';')
    .map((s) => s.trim())
    .filter(Boolean)) {
    const m = /^(\d+)\s*:\s*(\d+\.?\d*|\.\d+)$/.exec(entry);
    if (!m) {
      errors.push({ column: 'priceBreaks', message: `"${entry}" is not quantity:unit price (e.g. 100:0.25)` });
      return undefined;
    }
    out.push({ qty: Number(m[1]), unitPrice: Number(m[2]) });
  }
  return out;
}

/** The Zth pairs, filled from zth1 on without gaps (so a schema issue at point i is pair i + 1). */
function readZthPoints(get: (c: string) => string, errors: CellError[]): Record<string, unknown>[] {
  const points: Record<string, unknown>[] = [];
  let gapAt: number | null = null;
  for (let i = 1; i <= ZTH_POINTS_IN_CSV; i++) {
    const filled = ZTH_FIELDS.filter((f) => get(`zth${i}${f}`) !== '');
    if (filled.length === 0) {
      gapAt ??= i;
      continue;
    }
    if (gapAt !== null) {
      errors.push({ column: `zth${i}PulseS`, message: `fill the Zth pairs from zth1 on without a gap (zth${gapAt} is empty)` });
      return [];
    }
    const point: Record<string, unknown> = {};
    for (const f of filled) point[ZTH_KEYS[f]] = readValue(`zth${i}${f}`, get(`zth${i}${f}`), errors);
    points.push(point);
  }
  return points;
}

/** A CSV record → the object the part schema validates, plus errors found while reading cells. */
export function csvRowToInput(record: Record<string, string>): { input: Record<string, unknown>; errors: CellError[] } {
  const errors: CellError[] = [];
  const get = (c: string): string => restoreFormulaText((record[c] ?? '').trim());
  const category = get('category') as PartCategory;
  const input: Record<string, unknown> = {};
  for (const c of HEAD_COLUMNS) if (get(c) !== '') input[c] = get(c);
  if (!(category in CATEGORY_COLUMNS)) return { input, errors };
  const own = new Set(CATEGORY_COLUMNS[category]);
  for (const column of CSV_COLUMNS) {
    if (own.has(column) || (HEAD_COLUMNS as readonly string[]).includes(column) || (SOURCE_COLUMNS as readonly string[]).includes(column))
      continue;
    if (get(column) !== '') errors.push({ column, message: `does not apply to a ${category}; leave it empty` });
  }
  const params: Record<string, unknown> = {};
  for (const column of CATEGORY_COLUMNS[category]) {
    if (column.startsWith('rdsOn') || column.startsWith('zth') || get(column) === '') continue;
    params[column] = readValue(column, get(column), errors);
  }
  if (category === 'mosfet') {
    const points: Record<string, unknown>[] = [];
    for (let i = 1; i <= RDS_ON_POINTS_IN_CSV; i++) {
      const point: Record<string, unknown> = {};
      for (const f of RDS_FIELDS)
        if (get(`rdsOn${i}${f}`) !== '') point[RDS_KEYS[f]] = readValue(`rdsOn${i}${f}`, get(`rdsOn${i}${f}`), errors);
      if (Object.keys(point).length > 0) points.push(point);
    }
    params.rdsOn = points;
    params.zthPoints = readZthPoints(get, errors);
  }
  input.params = params;
  if (SOURCE_COLUMNS.some((c) => get(c) !== '')) {
    const source: Record<string, unknown> = {};
    for (const c of SOURCE_COLUMNS) {
      if (c === 'priceBreaks' || get(c) === '') continue;
      source[c] = readValue(c, get(c), errors);
    }
    source.priceBreaks = readPriceBreaks(get('priceBreaks'), errors) ?? [];
    input.sources = [source];
  }
  return { input, errors };
}

/** Maps a schema issue path (params.rdsOn.0.maxOhm, params.zthPoints.1.zthCPerW, sources.0.sku …) back to the CSV column. */
export function columnForPath(path: (string | number)[]): string {
  const [head, ...rest] = path;
  if (head === 'params') {
    if (rest[0] === 'rdsOn') {
      const index = typeof rest[1] === 'number' ? rest[1] + 1 : 1;
      const field = Object.entries(RDS_KEYS).find(([, key]) => key === rest[2])?.[0] ?? 'MaxOhm';
      return `rdsOn${index}${field}`;
    }
    if (rest[0] === 'zthPoints') {
      const index = typeof rest[1] === 'number' ? rest[1] + 1 : 1;
      return `zth${index}${rest[2] === 'zthCPerW' ? 'CPerW' : 'PulseS'}`;
    }
    return String(rest[0] ?? 'category');
  }
  if (head === 'sources') return rest[1] === 'priceBreaks' ? 'priceBreaks' : String(rest[1] ?? 'distributor');
  return String(head ?? 'category');
}
