/**
 * Search text with units → the API's own filter parameters. Every expected row is written by hand
 * from the rules stated in src/lib/query-units.ts (and README "Searching the catalogue"); the SI
 * values are converted by hand (10 mΩ = 0.01 Ω, 500 mA = 0.5 A). Each expected filter set must also
 * be a valid GET /api/parts query (partListQuerySchema), so the parser speaks the API's language.
 * Rows marked "stays text" check that part numbers and number-bearing words never become filters.
 */
import { all, create } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { parseQueryUnits, type QueryFilters } from '../../src/lib/query-units.ts';
import { filterChips } from '../../src/lib/filter-chips.ts';
import { partListQuerySchema } from '../../src/lib/schemas/parts.ts';

interface Row {
  query: string;
  filters: QueryFilters;
  rest: string;
  why: string;
}

const ROWS: Row[] = [
  { query: 'schottky 40 V', filters: { category: 'diode', kind: 'schottky', vrrmMinV: '40' }, rest: '', why: 'diode rating is VRRM' },
  { query: 'schottky 40V', filters: { category: 'diode', kind: 'schottky', vrrmMinV: '40' }, rest: '', why: 'unit joined' },
  { query: 'Schottky 40 v', filters: { category: 'diode', kind: 'schottky', vrrmMinV: '40' }, rest: '', why: 'lower-case unit' },
  {
    query: 'n-channel 30 V 2.5 V logic',
    filters: { category: 'mosfet', channel: 'n', vdsMinV: '30', rdsOnAtVgsV: '2.5' },
    rest: '',
    why: 'bare V on a MOSFET is VDS; "X V logic" is the drive',
  },
  {
    query: 'p-channel 60V 10 mΩ',
    filters: { category: 'mosfet', channel: 'p', vdsMinV: '60', rdsOnMaxOhm: '0.01', rdsOnAtVgsV: '10' },
    rest: '',
    why: 'RDS(on) without a drive is judged at 10 V',
  },
  {
    query: 'p-channel 60V 10 mohm',
    filters: { category: 'mosfet', channel: 'p', vdsMinV: '60', rdsOnMaxOhm: '0.01', rdsOnAtVgsV: '10' },
    rest: '',
    why: 'mohm spelled out',
  },
  {
    query: 'n-channel 10mΩ at 4.5 V',
    filters: { category: 'mosfet', channel: 'n', rdsOnMaxOhm: '0.01', rdsOnAtVgsV: '4.5' },
    rest: '',
    why: '"at X V" is the drive',
  },
  { query: 'gate driver 1.8 V', filters: { category: 'driver', supplyV: '1.8' }, rest: '', why: 'bare V on a driver is its supply' },
  {
    query: 'gate driver 3.3 V logic 12 V',
    filters: { category: 'driver', supplyV: '12', logicRailV: '3.3' },
    rest: '',
    why: '"X V logic" on a driver is the input rail',
  },
  { query: 'diode 2 A', filters: { category: 'diode', ifAvMinA: '2' }, rest: '', why: 'diode current is IF(AV)' },
  { query: 'diode 500 mA', filters: { category: 'diode', ifAvMinA: '0.5' }, rest: '', why: 'mA to A' },
  { query: 'mosfet 0.5A', filters: { category: 'mosfet', idMinA: '0.5' }, rest: '', why: 'MOSFET current is ID' },
  {
    query: 'logic-level n-channel sot-23',
    filters: { category: 'mosfet', channel: 'n', rdsOnAtVgsV: '4.5' },
    rest: 'sot-23',
    why: 'logic-level is the 4.5 V drive; package word stays text',
  },
  { query: 'VDS 30 V', filters: { category: 'mosfet', vdsMinV: '30' }, rest: '', why: 'parameter name names the category' },
  { query: 'vrrm 100V', filters: { category: 'diode', vrrmMinV: '100' }, rest: '', why: 'parameter name names the category' },
  {
    query: 'motor 12 V',
    filters: { category: 'motor', ratedVoltageMinV: '12', ratedVoltageMaxV: '12' },
    rest: '',
    why: 'motor rated voltage',
  },
  { query: 'CWN30L02-S3', filters: {}, rest: 'CWN30L02-S3', why: 'stays text: part number containing 30' },
  {
    query: 'mosfet CWN30L02-S3',
    filters: { category: 'mosfet' },
    rest: 'CWN30L02-S3',
    why: 'stays text: part number beside a category word',
  },
  { query: '2N-ish switch', filters: {}, rest: '2N-ish switch', why: 'stays text: number inside a word' },
  { query: '30 V', filters: {}, rest: '30 V', why: 'stays text: no category, a bare voltage means nothing yet' },
  { query: 'diode 30V-rated', filters: { category: 'diode' }, rest: '30V-rated', why: 'stays text: unit glued to a word' },
  { query: 'ORS10-40-D123', filters: {}, rest: 'ORS10-40-D123', why: 'stays text: seed part number with 40 in it' },
  {
    query: 'schottky 40 V 60 V',
    filters: { category: 'diode', kind: 'schottky', vrrmMinV: '40' },
    rest: '60 V',
    why: 'second value stays text',
  },
  { query: 'gate driver 2 A', filters: { category: 'driver' }, rest: '2 A', why: 'stays text: drivers have no current filter' },
  { query: 'schottky mosfet', filters: { category: 'diode', kind: 'schottky' }, rest: 'mosfet', why: 'first category wins' },
  { query: 'fast 30', filters: {}, rest: 'fast 30', why: 'stays text: a number without a unit' },
  {
    query: 'low noise n-channel 40 V',
    filters: { category: 'mosfet', channel: 'n', vdsMinV: '40' },
    rest: 'low noise',
    why: 'other words kept in order',
  },
];

describe('parseQueryUnits: hand-written table', () => {
  it.each(ROWS)('$query → $why', ({ query, filters, rest }) => {
    const parsed = parseQueryUnits(query);
    expect(parsed.filters).toEqual(filters);
    expect(parsed.rest).toBe(rest);
  });

  it.each(ROWS.filter((r) => Object.keys(r.filters).length > 0))('$query: the expected filters are a valid API query', ({ filters }) => {
    expect(partListQuerySchema.safeParse(filters).success).toBe(true);
  });
});

describe('parseQueryUnits: the category already chosen on the page', () => {
  it.each([
    ['30 V', 'mosfet', { category: 'mosfet', vdsMinV: '30' }, ''],
    ['40 V', 'diode', { category: 'diode', vrrmMinV: '40' }, ''],
    ['12 V', 'driver', { category: 'driver', supplyV: '12' }, ''],
    // A category named in the text wins over the chosen one (the page then starts that category afresh).
    ['schottky 40 V', 'mosfet', { category: 'diode', kind: 'schottky', vrrmMinV: '40' }, ''],
  ] as const)('%s with %s chosen', (query, category, filters, rest) => {
    expect(parseQueryUnits(query, { category })).toEqual({ filters, rest });
  });
});

// Second method for the prefix arithmetic: mathjs converts each typed quantity to SI.
const math = create(all);
describe('typed quantities against mathjs', () => {
  it.each([
    ['mosfet 500 mA', 'idMinA', '500 mA', 'A'],
    ['mosfet 0.5A', 'idMinA', '0.5 A', 'A'],
    ['mosfet 12.5 A', 'idMinA', '12.5 A', 'A'],
    ['mosfet 10mΩ', 'rdsOnMaxOhm', '10 mohm', 'ohm'],
    ['mosfet 4.7 mohm', 'rdsOnMaxOhm', '4.7 mohm', 'ohm'],
    ['mosfet 0.25 ohm', 'rdsOnMaxOhm', '0.25 ohm', 'ohm'],
    ['mosfet 2,5 mΩ', 'rdsOnMaxOhm', '2.5 mohm', 'ohm'],
    ['schottky 45 V', 'vrrmMinV', '45 V', 'V'],
    ['diode 1.2 kV', 'vrrmMinV', '1.2 kV', 'V'],
    ['gate driver 4500 mV', 'supplyV', '4500 mV', 'V'],
  ] as const)('%s', (query, key, typed, si) => {
    const value = Number(parseQueryUnits(query).filters[key]);
    expect(value).toBeCloseTo(math.unit(typed).toNumber(si), 12); // mathjs cross-check
  });
});

describe('filterChips: chip words, hand-written', () => {
  const rows: [string, string[]][] = [
    ['category=mosfet&channel=n&vdsMinV=30&rdsOnAtVgsV=2.5', ['MOSFETs', 'N-channel', 'VDS ≥ 30 V', 'RDS(on) specified at VGS ≤ 2.5 V']],
    ['category=mosfet&rdsOnMaxOhm=0.01&rdsOnAtVgsV=10', ['MOSFETs', 'RDS(on) ≤ 10 mΩ at VGS 10 V']],
    ['category=diode&kind=schottky&vrrmMinV=40&q=sot', ['Diodes', 'Schottky', 'VRRM ≥ 40 V']],
    ['ifAvMinA=0.5&sort=mpn&page=2', ['IF(AV) ≥ 500 mA']],
    ['category=driver&supplyV=12&logicRailV=3.3', ['Gate drivers and level shifters', 'Supply 12 V', 'Logic input at 3.3 V']],
    ['category=motor&ratedVoltageMinV=12&ratedVoltageMaxV=12', ['Motors', 'Rated voltage 12 V']],
    ['ratedVoltageMinV=6&ratedVoltageMaxV=12', ['Rated voltage ≥ 6 V', 'Rated voltage ≤ 12 V']],
  ];
  it.each(rows)('%s', (query, labels) => {
    expect(filterChips(new URLSearchParams(query)).map((c) => c.label)).toEqual(labels);
  });

  it('the RDS(on) chip removes the bound and its drive together (the API needs both or neither bound)', () => {
    const chip = filterChips(new URLSearchParams('rdsOnMaxOhm=0.01&rdsOnAtVgsV=10')).find((c) => c.label.startsWith('RDS(on)'));
    expect(chip?.keys.sort()).toEqual(['rdsOnAtVgsV', 'rdsOnMaxOhm']);
  });
});
