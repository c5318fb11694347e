/**
 * Search text with units → the parametric filters GET /api/parts already accepts (partListQuerySchema
 * in src/lib/schemas/parts.ts), plus the words left over for the text search. Pure: the search page
 * turns the result into URL parameters and filter chips; a shared link is then an ordinary API query.
 *
 * Rules (README "Searching the catalogue" repeats them):
 *  - A quantity is a whole word: a number and a unit, together or apart ("40V", "40 V", "40 v", "0.5A",
 *    "500 mA", "10mΩ", "10 mohm", "2,5 V"). A number inside a word ("CWN30L02-S3", "2N-ish", "30V-rated")
 *    is never a quantity and stays text. "m" and "M" both read as milli (mega is never meant here).
 *  - The category comes from words: MOSFET words and N/P-channel words → mosfet; diode, rectifier,
 *    Schottky, ultrafast, "fast recovery" → diode (Schottky etc. also set the kind); driver,
 *    "gate driver", "level shifter" → driver; motor → motor. The first category named wins; words for
 *    another category stay text. A parameter name (VDS, VRRM, supply) names its category when no
 *    word did. Without a category, quantities stay text: a bare "30 V" could mean anything.
 *  - A bare voltage is the category's voltage rating: MOSFET VDS (vdsMinV, at least), diode VRRM
 *    (vrrmMinV, at least), driver supply (supplyV, must lie in the rated range), motor rated voltage
 *    (ratedVoltageMinV = ratedVoltageMaxV). "VDS 30 V", "VRRM 40 V", "supply 12 V" say it outright.
 *  - A voltage followed by "logic" ("2.5 V logic") or after "VGS", "drive" or "at" is the gate drive:
 *    MOSFET rdsOnAtVgsV (parts whose RDS(on) is specified at or below it); on a driver "X V logic" is
 *    the input logic rail (logicRailV). "logic-level" alone is the 4.5 V drive (common practice:
 *    logic-level parts are specified at VGS 4.5 V).
 *  - A resistance on a MOSFET is RDS(on) at most (rdsOnMaxOhm). The API judges it at a drive; without
 *    one in the text it is judged at VGS 10 V, the standard-level drive (common practice).
 *  - A current is at least: MOSFET ID (idMinA), diode IF(AV) (ifAvMinA). Drivers and motors have no
 *    current filter, so a current there stays text.
 *  - Each parameter is taken once; a second value for it stays text.
 *  - When the text names no category, the one already chosen on the page (context) applies.
 */
import { prefixFactor, tidy } from './units.ts';
import type { PartCategory } from './domain/parts.ts';

/** The API parameters this parser can produce (a subset of partListQuerySchema's keys). */
export type QueryFilterKey =
  | 'category'
  | 'channel'
  | 'kind'
  | 'vdsMinV'
  | 'rdsOnAtVgsV'
  | 'rdsOnMaxOhm'
  | 'idMinA'
  | 'logicRailV'
  | 'supplyV'
  | 'vrrmMinV'
  | 'ifAvMinA'
  | 'ratedVoltageMinV'
  | 'ratedVoltageMaxV';

export type QueryFilters = Partial<Record<QueryFilterKey, string>>;

export interface ParsedQuery {
  /** API parameter → value exactly as the URL carries it (SI units, as the key names). */
  filters: QueryFilters;
  /** The words left for the text search, in their order, single-spaced. */
  rest: string;
}

/** Gate drive assumed for an RDS(on) bound given without one: standard-level drive (common practice). */
export const DEFAULT_RDSON_DRIVE_V = 10;
/** Gate drive a "logic-level" MOSFET is specified at (common practice). */
export const LOGIC_LEVEL_DRIVE_V = 4.5;

type Base = 'V' | 'A' | 'Ω';

interface Word {
  text: string;
  lower: string;
  used: boolean;
}

const CATEGORY_WORDS: Record<string, PartCategory> = {
  mosfet: 'mosfet',
  mosfets: 'mosfet',
  fet: 'mosfet',
  fets: 'mosfet',
  diode: 'diode',
  diodes: 'diode',
  rectifier: 'diode',
  rectifiers: 'diode',
  driver: 'driver',
  drivers: 'driver',
  'gate-driver': 'driver',
  'gate-drivers': 'driver',
  'level-shifter': 'driver',
  'level-shifters': 'driver',
  motor: 'motor',
  motors: 'motor',
};

const CHANNEL_WORDS: Record<string, 'n' | 'p'> = {
  'n-channel': 'n',
  nchannel: 'n',
  'n-ch': 'n',
  nch: 'n',
  nmos: 'n',
  nfet: 'n',
  'n-fet': 'n',
  'n-mosfet': 'n',
  'p-channel': 'p',
  pchannel: 'p',
  'p-ch': 'p',
  pch: 'p',
  pmos: 'p',
  pfet: 'p',
  'p-fet': 'p',
  'p-mosfet': 'p',
};

const KIND_WORDS: Record<string, 'schottky' | 'ultrafast' | 'fast' | 'general'> = {
  schottky: 'schottky',
  schottkys: 'schottky',
  schottkies: 'schottky',
  ultrafast: 'ultrafast',
  'ultra-fast': 'ultrafast',
  'fast-recovery': 'fast',
};

/** Two-word phrases read as one word (joined with "-"). */
const PHRASES = new Set([
  'gate driver',
  'gate drivers',
  'level shifter',
  'level shifters',
  'n channel',
  'p channel',
  'ultra fast',
  'fast recovery',
  'logic level',
]);

/** Parameter names that say which rating a following quantity is, and the category they belong to. */
const LABELS: Record<string, { key: QueryFilterKey; category: PartCategory }> = {
  vds: { key: 'vdsMinV', category: 'mosfet' },
  vdss: { key: 'vdsMinV', category: 'mosfet' },
  vgs: { key: 'rdsOnAtVgsV', category: 'mosfet' },
  drive: { key: 'rdsOnAtVgsV', category: 'mosfet' },
  id: { key: 'idMinA', category: 'mosfet' },
  rds: { key: 'rdsOnMaxOhm', category: 'mosfet' },
  rdson: { key: 'rdsOnMaxOhm', category: 'mosfet' },
  'rds(on)': { key: 'rdsOnMaxOhm', category: 'mosfet' },
  vrrm: { key: 'vrrmMinV', category: 'diode' },
  vr: { key: 'vrrmMinV', category: 'diode' },
  if: { key: 'ifAvMinA', category: 'diode' },
  'if(av)': { key: 'ifAvMinA', category: 'diode' },
  supply: { key: 'supplyV', category: 'driver' },
  vcc: { key: 'supplyV', category: 'driver' },
  vdd: { key: 'supplyV', category: 'driver' },
};

const NUMBER = String.raw`(?:[<>]=?|[≤≥])?(\d+(?:[.,]\d+)?|[.,]\d+)`;
const UNIT = String.raw`(m|µ|u|k)?(v|volts?|a|amps?|ω|ohms?)|(milliohms?|milliamps?|millivolts?)`;
const QUANTITY_WORD = new RegExp(`^${NUMBER}(?:${UNIT})$`, 'u');
const NUMBER_WORD = new RegExp(`^${NUMBER}$`, 'u');
const UNIT_WORD = new RegExp(`^(?:${UNIT})$`, 'u');

function unitOf(
  prefix: string | undefined,
  base: string | undefined,
  milliWord: string | undefined,
): { base: Base; factor: number } | null {
  if (milliWord) {
    const b: Base = milliWord.startsWith('milliohm') ? 'Ω' : milliWord.startsWith('milliamp') ? 'A' : 'V';
    return { base: b, factor: 1e-3 };
  }
  if (!base) return null;
  const factor = prefixFactor(prefix ?? '');
  if (factor === undefined) return null;
  const b: Base = base.startsWith('v') ? 'V' : base.startsWith('a') ? 'A' : 'Ω';
  return { base: b, factor };
}

/** "40V" or "40" + "V" at position i → the SI value and how many words it took. */
function quantityAt(words: Word[], i: number): { value: number; base: Base; span: number } | null {
  const w = words[i];
  const whole = QUANTITY_WORD.exec(w.lower);
  if (whole) {
    const unit = unitOf(whole[2], whole[3], whole[4]);
    return unit ? { value: tidy(Number(whole[1].replace(',', '.')) * unit.factor), base: unit.base, span: 1 } : null;
  }
  const num = NUMBER_WORD.exec(w.lower);
  const next = words[i + 1];
  if (!num || !next || next.used) return null;
  const u = UNIT_WORD.exec(next.lower);
  if (!u) return null;
  const unit = unitOf(u[1], u[2], u[3]);
  return unit ? { value: tidy(Number(num[1].replace(',', '.')) * unit.factor), base: unit.base, span: 2 } : null;
}

function splitWords(query: string): Word[] {
  const raw = query
    .trim()
    .split(/\s+/u)
    .filter((t) => t !== '');
  const words: Word[] = [];
  for (let i = 0; i < raw.length; i++) {
    const pair = i + 1 < raw.length ? `${raw[i]} ${raw[i + 1]}`.toLowerCase() : '';
    if (PHRASES.has(pair)) {
      words.push({ text: `${raw[i]} ${raw[i + 1]}`, lower: pair.replace(' ', '-'), used: false });
      i++;
    } else {
      // Commas and semicolons between terms are separators, not part of the word.
      const text = raw[i];
      words.push({ text, lower: text.toLowerCase().replace(/[,;]$/u, ''), used: false });
    }
  }
  return words;
}

/** What a bare quantity means in a category (see the rules above); null: no filter, stays text. */
function bareKey(category: PartCategory, base: Base): QueryFilterKey | null {
  if (base === 'V')
    return { mosfet: 'vdsMinV', diode: 'vrrmMinV', driver: 'supplyV', motor: 'ratedVoltageMinV' }[category] as QueryFilterKey;
  if (base === 'A') return category === 'mosfet' ? 'idMinA' : category === 'diode' ? 'ifAvMinA' : null;
  return category === 'mosfet' ? 'rdsOnMaxOhm' : null;
}

const KEY_BASE: Partial<Record<QueryFilterKey, Base>> = {
  vdsMinV: 'V',
  rdsOnAtVgsV: 'V',
  rdsOnMaxOhm: 'Ω',
  idMinA: 'A',
  logicRailV: 'V',
  supplyV: 'V',
  vrrmMinV: 'V',
  ifAvMinA: 'A',
  ratedVoltageMinV: 'V',
};

/**
 * `context.category` is the category already chosen (the search page passes its current one), used
 * when the text names none: with MOSFETs chosen, "30 V" alone is VDS ≥ 30 V.
 */
export function parseQueryUnits(query: string, context: { category?: PartCategory } = {}): ParsedQuery {
  const words = splitWords(query);
  const filters: QueryFilters = {};
  let category: PartCategory | undefined;

  // 1. Category, channel and kind words (anywhere in the text).
  for (const w of words) {
    const cat = CATEGORY_WORDS[w.lower];
    const channel = CHANNEL_WORDS[w.lower];
    const kind = KIND_WORDS[w.lower];
    const impliedCategory: PartCategory | undefined = cat ?? (channel ? 'mosfet' : kind ? 'diode' : undefined);
    if (!impliedCategory) continue;
    if (category && category !== impliedCategory) continue;
    if (channel && filters.channel) continue;
    if (kind && filters.kind) continue;
    category = impliedCategory;
    if (channel) filters.channel = channel;
    if (kind) filters.kind = kind;
    w.used = true;
  }
  // A parameter name before a quantity names the category when no word did.
  if (!category) {
    for (let i = 0; i < words.length - 1 && !category; i++) {
      const label = LABELS[words[i].lower];
      if (label && quantityAt(words, i + 1)) category = label.category;
    }
  }
  category ??= context.category;

  // 2. Quantities, read with the words around them.
  if (category) {
    for (let i = 0; i < words.length; i++) {
      if (words[i].used) continue;
      const q = quantityAt(words, i);
      if (!q) continue;
      const before = i > 0 && !words[i - 1].used ? words[i - 1] : undefined;
      const after = words[i + q.span] && !words[i + q.span].used ? words[i + q.span] : undefined;
      const label = before ? LABELS[before.lower] : undefined;
      let key: QueryFilterKey | null;
      let context: Word | undefined;
      if (q.base === 'V' && after && (after.lower === 'logic' || after.lower === 'logic-level')) {
        key = category === 'mosfet' ? 'rdsOnAtVgsV' : category === 'driver' ? 'logicRailV' : null;
        context = after;
      } else if (q.base === 'V' && before && before.lower === 'at' && category === 'mosfet') {
        key = 'rdsOnAtVgsV';
        context = before;
      } else if (label && label.category === category && KEY_BASE[label.key] === q.base) {
        key = label.key;
        context = before;
      } else {
        key = bareKey(category, q.base);
      }
      if (!key || filters[key] !== undefined) continue;
      filters[key] = String(q.value);
      if (key === 'ratedVoltageMinV') filters.ratedVoltageMaxV = String(q.value);
      for (let j = i; j < i + q.span; j++) words[j].used = true;
      if (context) context.used = true;
      i += q.span - 1;
    }
    // 3. "logic-level" without a number; an RDS(on) bound needs the drive it is judged at.
    if (category === 'mosfet') {
      const logicLevel = words.find((w) => !w.used && w.lower === 'logic-level');
      if (logicLevel && filters.rdsOnAtVgsV === undefined) {
        filters.rdsOnAtVgsV = String(LOGIC_LEVEL_DRIVE_V);
        logicLevel.used = true;
      }
      if (filters.rdsOnMaxOhm !== undefined && filters.rdsOnAtVgsV === undefined) filters.rdsOnAtVgsV = String(DEFAULT_RDSON_DRIVE_V);
    }
    filters.category = category;
  }

  return {
    filters: orderedFilters(filters),
    rest: words
      .filter((w) => !w.used)
      .map((w) => w.text)
      .join(' '),
  };
}

const ORDER: QueryFilterKey[] = [
  'category',
  'kind',
  'channel',
  'vdsMinV',
  'vrrmMinV',
  'supplyV',
  'logicRailV',
  'ratedVoltageMinV',
  'ratedVoltageMaxV',
  'rdsOnMaxOhm',
  'rdsOnAtVgsV',
  'idMinA',
  'ifAvMinA',
];

function orderedFilters(filters: QueryFilters): QueryFilters {
  const out: QueryFilters = {};
  for (const k of ORDER) if (filters[k] !== undefined) out[k] = filters[k];
  return out;
}

/** What the API understood in `q`: the filters taken from it (only those not also given explicitly). */
export interface ExpandedQuery {
  /** The request's parameters with those filters added and `q` left with the words that stay text. */
  params: URLSearchParams;
  understood: QueryFilters;
}

/**
 * The search API's reading of its `q` parameter, the same as the search page's: quantities with units
 * become filters ("schottky 40 V" → diodes, Schottky, VRRM ≥ 40 V) and the rest stays text. A filter given
 * explicitly wins over the one read from the text; `units=off` leaves the text as it is.
 */
export function expandQueryText(input: URLSearchParams): ExpandedQuery {
  const params = new URLSearchParams(input);
  const q = params.get('q');
  if (params.get('units') === 'off' || !q) return { params, understood: {} };
  const chosen = params.get('category');
  const known: readonly PartCategory[] = ['motor', 'mosfet', 'driver', 'diode'];
  const context = known.includes(chosen as PartCategory) ? { category: chosen as PartCategory } : {};
  const parsed = parseQueryUnits(q, context);
  const understood: QueryFilters = {};
  for (const [key, value] of Object.entries(parsed.filters) as [QueryFilterKey, string][]) {
    if (params.has(key)) continue;
    params.set(key, value);
    understood[key] = value;
  }
  if (Object.keys(parsed.filters).length > 0) {
    if (parsed.rest) params.set('q', parsed.rest);
    else params.delete('q');
  }
  return { params, understood };
}
