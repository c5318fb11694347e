/**
 * A part's change as people read it in its history: grouped (record, parameters, sources) and formatted in
 * the units of the datasheet ("VDS max 30 V → 40 V", "added RDS(on) line 32 mΩ at 2.5 V, 25 °C"),
 * never as SI numbers under field paths. Pure: two snapshots in, lines out; [] when nothing differs.
 */
import type { Part, PartSource, RdsOnSpecPoint, ZthPoint } from './domain/parts.ts';
import { LIFECYCLE_LABELS, REVIEW_LABELS } from './labels.ts';
import { price, quantity, sig, whole } from './units.ts';

export interface PartChangeGroup {
  title: 'Record' | 'Parameters' | 'Sources and prices';
  lines: string[];
}

type Fmt = (x: unknown) => string;
const NONE = '—';
const num =
  (unit: string, scale = 1, digits = 4): Fmt =>
  (x) =>
    typeof x === 'number' ? quantity(x * scale, unit, digits) : NONE;
const text: Fmt = (x) => (x === null || x === undefined || x === '' ? NONE : String(x));
const yesNo =
  (yes: string, no: string): Fmt =>
  (x) =>
    x ? yes : no;
const words =
  (table: Record<string, string>): Fmt =>
  (x) =>
    table[String(x)] ?? String(x);

/** Each scalar parameter per category: its key, the label a datasheet reader knows, its unit. */
const PARAMS: Record<Part['category'], [key: string, label: string, fmt: Fmt][]> = {
  mosfet: [
    ['channel', 'Channel', words({ n: 'N-channel', p: 'P-channel' })],
    ['vdsMaxV', 'VDS max', num('V')],
    ['vgsMaxV', 'VGS max', num('V')],
    ['vgsThMinV', 'VGS(th) min', num('V')],
    ['vgsThMaxV', 'VGS(th) max', num('V')],
    ['vgsThTestCurrentA', 'VGS(th) test current', num('µA', 1e6)],
    ['idContinuousA', 'ID continuous', num('A')],
    ['idPulsedA', 'ID pulsed', num('A')],
    ['qgTotalNc', 'Qg total', num('nC')],
    ['qgTestVgsV', 'Qg test VGS', num('V')],
    ['qgsNc', 'Qgs', num('nC')],
    ['qgdNc', 'Qgd', num('nC')],
    ['vPlateauV', 'Miller plateau', num('V')],
    ['rthJaCPerW', 'RθJA', num('K/W')],
    ['tjMaxC', 'Tj max', num('°C')],
    ['bodyDiodeVfV', 'Body-diode VF', num('V')],
  ],
  driver: [
    ['kind', 'Kind', words({ 'gate-driver': 'gate driver', 'level-shifter': 'level shifter' })],
    ['channels', 'Channels', text],
    ['inverting', 'Polarity', yesNo('inverting', 'non-inverting')],
    ['supplyMinV', 'Supply min', num('V')],
    ['supplyMaxV', 'Supply max', num('V')],
    [
      'inputLogic',
      'Input thresholds',
      words({ fixed: 'fixed (TTL-style)', ratio: 'ratio of own supply', 'input-rail': 'ratio of the input rail' }),
    ],
    ['inputHighMin', 'VIH min', (x) => sig(x as number, 4)],
    ['inputLowMax', 'VIL max', (x) => sig(x as number, 4)],
    ['outputHighDropV', 'Output high drop', num('V')],
    ['outputLowMaxV', 'VOL max', num('V')],
    ['sourceCurrentA', 'Peak source current', num('A')],
    ['sinkCurrentA', 'Peak sink current', num('A')],
    ['propagationDelayNs', 'Propagation delay', num('ns')],
    ['inputPull', 'Input pull', words({ up: 'pull-up', down: 'pull-down', none: 'none' })],
    ['inputPullOhms', 'Input pull value', num('kΩ', 1e-3)],
  ],
  diode: [
    ['kind', 'Kind', words({ schottky: 'Schottky', ultrafast: 'ultrafast', fast: 'fast', general: 'general purpose' })],
    ['vrrmV', 'VRRM', num('V')],
    ['ifAvA', 'IF(AV)', num('A')],
    ['ifsmA', 'IFSM', num('A')],
    ['vfV', 'VF max', num('V')],
    ['vfAtIfA', 'VF test current', num('A')],
    ['trrNs', 'trr', (x) => (x === null ? 'none (Schottky)' : num('ns')(x))],
    ['ifrmA', 'IFRM', num('A')],
    ['rthJaCPerW', 'RθJA', num('K/W')],
    ['tjMaxC', 'Tj max', num('°C')],
  ],
  motor: [
    ['ratedVoltageV', 'Rated voltage', num('V')],
    ['voltageMinV', 'Operating min', num('V')],
    ['voltageMaxV', 'Operating max', num('V')],
    ['noLoadSpeedRpm', 'No-load speed', num('rpm', 1, 5)],
    ['noLoadCurrentA', 'No-load current', num('mA', 1000)],
    ['stallTorqueNm', 'Stall torque', num('mN·m', 1000)],
    ['stallCurrentA', 'Stall current', num('A')],
    ['terminalResistanceOhm', 'Terminal resistance', num('Ω')],
    ['inductanceH', 'Inductance', num('mH', 1000)],
    ['rotorInertiaKgM2', 'Rotor inertia', num('g·cm²', 1e7)],
  ],
};

const mOhm = (ohm: number): string => quantity(ohm * 1000, 'mΩ', 4);
const rdsAt = (r: RdsOnSpecPoint): string => `at ${quantity(r.vgsV, 'V')}, ${quantity(r.tjC, '°C')}`;
const rdsLine = (r: RdsOnSpecPoint): string =>
  `${mOhm(r.maxOhm)} ${rdsAt(r)}${r.typOhm === null ? '' : ` (typ. ${mOhm(r.typOhm)})`}${r.idA === null ? '' : `, ID ${quantity(r.idA, 'A')}`}`;
const pulse = (s: number): string => (s < 1 ? quantity(s * 1000, 'ms') : quantity(s, 's'));

/** Lines keyed by `key`: added, removed, and changed in place (described by `changed`). */
function keyedChanges<T>(
  before: T[],
  after: T[],
  key: (x: T) => string,
  added: (x: T) => string,
  removed: (x: T) => string,
  changed: (b: T, a: T) => string[],
): string[] {
  const b = new Map(before.map((x) => [key(x), x]));
  const a = new Map(after.map((x) => [key(x), x]));
  const out: string[] = [];
  for (const [k, x] of b) if (!a.has(k)) out.push(removed(x));
  for (const [k, x] of a) {
    const old = b.get(k);
    out.push(...(old ? changed(old, x) : [added(x)]));
  }
  return out;
}

const arrow = (label: string, b: string, a: string): string[] => (b === a ? [] : [`${label} ${b} → ${a}`]);

function rdsChanges(before: RdsOnSpecPoint[], after: RdsOnSpecPoint[]): string[] {
  return keyedChanges(
    before,
    after,
    (r) => `${r.vgsV}|${r.tjC}`,
    (r) => `added RDS(on) line ${rdsLine(r)}`,
    (r) => `removed RDS(on) line ${rdsLine(r)}`,
    (b, a) => {
      const parts = [
        ...arrow('max', mOhm(b.maxOhm), mOhm(a.maxOhm)),
        ...arrow('typ.', b.typOhm === null ? NONE : mOhm(b.typOhm), a.typOhm === null ? NONE : mOhm(a.typOhm)),
        ...arrow('ID', b.idA === null ? NONE : quantity(b.idA, 'A'), a.idA === null ? NONE : quantity(a.idA, 'A')),
      ];
      return parts.length ? [`RDS(on) ${rdsAt(a)}: ${parts.join(', ')}`] : [];
    },
  );
}

function zthChanges(before: ZthPoint[], after: ZthPoint[]): string[] {
  return keyedChanges(
    before,
    after,
    (z) => String(z.pulseS),
    (z) => `added Zth point ${quantity(z.zthCPerW, 'K/W')} at ${pulse(z.pulseS)}`,
    (z) => `removed Zth point ${quantity(z.zthCPerW, 'K/W')} at ${pulse(z.pulseS)}`,
    (b, a) => arrow(`Zth at ${pulse(a.pulseS)}`, quantity(b.zthCPerW, 'K/W'), quantity(a.zthCPerW, 'K/W')),
  );
}

const breaks = (s: PartSource): string =>
  (s.priceBreaks ?? []).length === 0 ? 'none' : s.priceBreaks.map((b) => `${whole(b.qty)}+: ${price(b.unitPrice, s.currency)}`).join(' · ');
const sourceName = (s: PartSource): string => `${s.distributor} ${s.sku}`;
const days = (n: number): string => `${whole(n)} ${n === 1 ? 'day' : 'days'}`;

/**
 * Price breaks of one source in one currency, break by break: "break 100: 0.2500 → 0.2200 EUR",
 * "added break 500: 0.2000 EUR", "removed break 1,000". A change of currency restates the whole list.
 */
function breakChanges(b: PartSource, a: PartSource): string[] {
  if (b.currency !== a.currency) return [`currency ${b.currency} → ${a.currency}`, ...arrow('prices', breaks(b), breaks(a))];
  const amount = (x: number): string => price(x, '').trim();
  const out: string[] = [];
  const old = new Map((b.priceBreaks ?? []).map((x) => [x.qty, x.unitPrice]));
  const now = new Map((a.priceBreaks ?? []).map((x) => [x.qty, x.unitPrice]));
  for (const [qty, unitPrice] of old) if (!now.has(qty)) out.push(`removed break ${whole(qty)} (was ${price(unitPrice, b.currency)})`);
  for (const [qty, unitPrice] of now) {
    const was = old.get(qty);
    if (was === undefined) out.push(`added break ${whole(qty)}: ${price(unitPrice, a.currency)}`);
    else if (amount(was) !== amount(unitPrice)) out.push(`break ${whole(qty)}: ${amount(was)} → ${price(unitPrice, a.currency)}`);
  }
  return out;
}

function sourceChanges(before: PartSource[], after: PartSource[]): string[] {
  return keyedChanges(
    before,
    after,
    (s) => `${s.distributor}|${s.sku}`,
    (s) =>
      `added source ${sourceName(s)}: stock ${whole(s.stockQty)}, MOQ ${whole(s.moq)}, order multiple ${whole(s.orderMultiple ?? 1)}, lead time ${days(s.leadTimeDays)}, prices ${breaks(s)}`,
    (s) => `removed source ${sourceName(s)}`,
    (b, a) => {
      const parts = [
        ...arrow('stock', whole(b.stockQty), whole(a.stockQty)),
        ...arrow('MOQ', whole(b.moq), whole(a.moq)),
        // Versions stored before order multiples existed had none: that was "any quantity" (1).
        ...arrow('order multiple', whole(b.orderMultiple ?? 1), whole(a.orderMultiple ?? 1)),
        ...arrow('lead time', days(b.leadTimeDays), days(a.leadTimeDays)),
        ...breakChanges(b, a),
      ];
      return parts.length ? [`${sourceName(a)}: ${parts.join('; ')}`] : [];
    },
  );
}

/** The change from `before` to `after`, grouped; groups without a line are left out. */
export function describePartChanges(before: Part, after: Part): PartChangeGroup[] {
  const record = [
    ...arrow('Manufacturer', before.manufacturer, after.manufacturer),
    ...arrow('Part number', before.mpn, after.mpn),
    ...arrow('Package', text(before.package), text(after.package)),
    ...(before.description === after.description ? [] : ['Description rewritten']),
    ...arrow('Review', REVIEW_LABELS[before.reviewStatus].long, REVIEW_LABELS[after.reviewStatus].long),
    ...arrow('Lifecycle', LIFECYCLE_LABELS[before.lifecycle].long, LIFECYCLE_LABELS[after.lifecycle].long),
    ...arrow('Lifecycle effective', text(before.lifecycleEffectiveDate), text(after.lifecycleEffectiveDate)),
  ];
  const params: string[] = [];
  if (before.category !== after.category) {
    params.push(`Category ${before.category} → ${after.category}`);
  } else {
    const b = before.params as unknown as Record<string, unknown>;
    const a = after.params as unknown as Record<string, unknown>;
    for (const [key, label, fmt] of PARAMS[after.category]) params.push(...arrow(label, fmt(b[key] ?? null), fmt(a[key] ?? null)));
    if (before.category === 'mosfet' && after.category === 'mosfet') {
      // Older snapshots may lack the lists added later.
      params.push(
        ...rdsChanges(before.params.rdsOn ?? [], after.params.rdsOn ?? []),
        ...zthChanges(before.params.zthPoints ?? [], after.params.zthPoints ?? []),
      );
    }
  }
  const sources = sourceChanges(before.sources ?? [], after.sources ?? []);
  const groups: PartChangeGroup[] = [
    { title: 'Record', lines: record },
    { title: 'Parameters', lines: params },
    { title: 'Sources and prices', lines: sources },
  ];
  return groups.filter((g) => g.lines.length > 0);
}
