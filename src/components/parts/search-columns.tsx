/** Table columns of the search page per category: label, unit, how a cell reads, and the API sort key. */
import { sig, price } from '../../lib/units.ts';
import type { Lifecycle, Part, PartCategory } from '../../lib/domain/parts.ts';
import { LIFECYCLE_LABELS } from '../../lib/labels.ts';
import { bestUnitPrice, CATEGORY_LABELS, totalStock } from '../../lib/part-summary.ts';
import { openInputOutput } from '../../lib/driver-input.ts';

export interface SearchColumn {
  id: string;
  label: string;
  unit?: string;
  /** API sort key (GET /api/parts?sort=…); absent = not sortable. */
  sortKey?: string;
  numeric?: boolean;
  defaultVisible?: boolean;
  cell: (part: Part) => string;
}

const LIFE = (l: Lifecycle): string => LIFECYCLE_LABELS[l].short;

const COMMON_HEAD: SearchColumn[] = [
  { id: 'manufacturer', label: 'Maker', sortKey: 'manufacturer', defaultVisible: true, cell: (p) => p.manufacturer },
  { id: 'package', label: 'Package', sortKey: 'package', defaultVisible: true, cell: (p) => p.package },
];

const COMMON_TAIL: SearchColumn[] = [
  {
    id: 'price1k',
    label: 'Best price @1k',
    numeric: true,
    defaultVisible: true,
    cell: (p) => {
      const best = bestUnitPrice(p, 1000);
      return best ? price(best.price, best.currency) : '—';
    },
  },
  { id: 'stock', label: 'Stock', unit: 'pcs', numeric: true, cell: (p) => String(totalStock(p)) },
  { id: 'lifecycle', label: 'Lifecycle', sortKey: 'lifecycle', defaultVisible: true, cell: (p) => LIFE(p.lifecycle) },
  { id: 'description', label: 'Description', cell: (p) => p.description },
];

function mosfet(p: Part) {
  return p.category === 'mosfet' ? p.params : null;
}

const CATEGORY_COLUMNS: Record<PartCategory, SearchColumn[]> = {
  mosfet: [
    { id: 'channel', label: 'Ch.', defaultVisible: true, cell: (p) => mosfet(p)?.channel.toUpperCase() ?? '' },
    {
      id: 'vds',
      label: 'VDS max',
      unit: 'V',
      sortKey: 'vdsMaxV',
      numeric: true,
      defaultVisible: true,
      cell: (p) => sig(mosfet(p)?.vdsMaxV),
    },
    { id: 'vgsMax', label: 'VGS max', unit: 'V', numeric: true, cell: (p) => sig(mosfet(p)?.vgsMaxV) },
    {
      id: 'vgsTh',
      label: 'VGS(th) max',
      unit: 'V',
      sortKey: 'vgsThMaxV',
      numeric: true,
      defaultVisible: true,
      cell: (p) => sig(mosfet(p)?.vgsThMaxV),
    },
    {
      id: 'lowestVgs',
      label: 'Lowest spec VGS',
      unit: 'V',
      sortKey: 'minRdsOnVgsV',
      numeric: true,
      cell: (p) => sig(Math.min(...(mosfet(p)?.rdsOn.map((r) => r.vgsV) ?? [NaN]))),
    },
    {
      id: 'rdsOn',
      label: 'RDS(on) max at VGS',
      unit: 'mΩ @ V',
      defaultVisible: true,
      cell: (p) =>
        (mosfet(p)?.rdsOn ?? [])
          .filter((r) => Math.abs(r.tjC - 25) <= 1)
          .map((r) => `${sig(r.maxOhm * 1000)} @ ${sig(r.vgsV)}`)
          .join(' · '),
    },
    {
      id: 'id',
      label: 'ID (25 °C)',
      unit: 'A',
      sortKey: 'idContinuousA',
      numeric: true,
      defaultVisible: true,
      cell: (p) => sig(mosfet(p)?.idContinuousA),
    },
    { id: 'idm', label: 'IDM', unit: 'A', numeric: true, cell: (p) => sig(mosfet(p)?.idPulsedA) },
    {
      id: 'qg',
      label: 'Qg',
      unit: 'nC',
      sortKey: 'qgTotalNc',
      numeric: true,
      defaultVisible: true,
      cell: (p) => sig(mosfet(p)?.qgTotalNc),
    },
    { id: 'rth', label: 'RθJA', unit: 'K/W', sortKey: 'rthJaCPerW', numeric: true, cell: (p) => sig(mosfet(p)?.rthJaCPerW) },
  ],
  driver: [
    {
      id: 'kind',
      label: 'Kind',
      defaultVisible: true,
      cell: (p) => (p.category === 'driver' ? (p.params.kind === 'gate-driver' ? 'Gate driver' : 'Level shifter') : ''),
    },
    {
      id: 'polarity',
      label: 'Polarity',
      defaultVisible: true,
      cell: (p) => (p.category === 'driver' ? (p.params.inverting ? 'Inverting' : 'Non-inverting') : ''),
    },
    {
      id: 'supplyMin',
      label: 'Supply min',
      unit: 'V',
      sortKey: 'supplyMinV',
      numeric: true,
      defaultVisible: true,
      cell: (p) => (p.category === 'driver' ? sig(p.params.supplyMinV) : ''),
    },
    {
      id: 'supplyMax',
      label: 'Supply max',
      unit: 'V',
      sortKey: 'supplyMaxV',
      numeric: true,
      defaultVisible: true,
      cell: (p) => (p.category === 'driver' ? sig(p.params.supplyMaxV) : ''),
    },
    {
      id: 'vih',
      label: 'VIH min',
      defaultVisible: true,
      cell: (p) => {
        if (p.category !== 'driver') return '';
        const d = p.params;
        return d.inputLogic === 'fixed'
          ? `${sig(d.inputHighMin)} V`
          : `${Math.round(d.inputHighMin * 100)} % of ${d.inputLogic === 'ratio' ? 'supply' : 'input rail'}`;
      },
    },
    {
      id: 'source',
      label: 'Source',
      unit: 'A',
      sortKey: 'sourceCurrentA',
      numeric: true,
      defaultVisible: true,
      cell: (p) => (p.category === 'driver' ? sig(p.params.sourceCurrentA) : ''),
    },
    { id: 'sink', label: 'Sink', unit: 'A', numeric: true, cell: (p) => (p.category === 'driver' ? sig(p.params.sinkCurrentA) : '') },
    {
      id: 'tpd',
      label: 'Delay',
      unit: 'ns',
      sortKey: 'propagationDelayNs',
      numeric: true,
      cell: (p) => (p.category === 'driver' ? sig(p.params.propagationDelayNs) : ''),
    },
    {
      id: 'inputPull',
      label: 'Input pull',
      cell: (p) => {
        if (p.category !== 'driver') return '';
        const d = p.params;
        return d.inputPull === 'none' ? 'none' : `${d.inputPull}${d.inputPullOhms != null ? ` ${sig(d.inputPullOhms / 1000)} kΩ` : ''}`;
      },
    },
    {
      id: 'openInput',
      label: 'Output, input open',
      cell: (p) => (p.category === 'driver' ? openInputOutput(p.params.inputPull, p.params.inverting) : ''),
    },
  ],
  diode: [
    { id: 'kind', label: 'Kind', defaultVisible: true, cell: (p) => (p.category === 'diode' ? p.params.kind : '') },
    {
      id: 'vrrm',
      label: 'VRRM',
      unit: 'V',
      sortKey: 'vrrmV',
      numeric: true,
      defaultVisible: true,
      cell: (p) => (p.category === 'diode' ? sig(p.params.vrrmV) : ''),
    },
    {
      id: 'ifav',
      label: 'IF(AV)',
      unit: 'A',
      sortKey: 'ifAvA',
      numeric: true,
      defaultVisible: true,
      cell: (p) => (p.category === 'diode' ? sig(p.params.ifAvA) : ''),
    },
    {
      id: 'vf',
      label: 'VF max',
      unit: 'V',
      sortKey: 'vfV',
      numeric: true,
      defaultVisible: true,
      cell: (p) => (p.category === 'diode' ? `${sig(p.params.vfV)} @ ${sig(p.params.vfAtIfA)} A` : ''),
    },
    {
      id: 'trr',
      label: 'trr',
      unit: 'ns',
      sortKey: 'trrNs',
      numeric: true,
      defaultVisible: true,
      cell: (p) => (p.category === 'diode' ? (p.params.trrNs === null ? 'none' : sig(p.params.trrNs)) : ''),
    },
    { id: 'ifsm', label: 'IFSM', unit: 'A', numeric: true, cell: (p) => (p.category === 'diode' ? sig(p.params.ifsmA) : '') },
    { id: 'ifrm', label: 'IFRM', unit: 'A', numeric: true, cell: (p) => (p.category === 'diode' ? sig(p.params.ifrmA) : '') },
    { id: 'rthD', label: 'RθJA', unit: 'K/W', numeric: true, cell: (p) => (p.category === 'diode' ? sig(p.params.rthJaCPerW) : '') },
    { id: 'tjD', label: 'Tj max', unit: '°C', numeric: true, cell: (p) => (p.category === 'diode' ? sig(p.params.tjMaxC) : '') },
  ],
  motor: [
    {
      id: 'rated',
      label: 'Rated',
      unit: 'V',
      sortKey: 'ratedVoltageV',
      numeric: true,
      defaultVisible: true,
      cell: (p) => (p.category === 'motor' ? sig(p.params.ratedVoltageV) : ''),
    },
    {
      id: 'speed',
      label: 'No-load speed',
      unit: 'rpm',
      sortKey: 'noLoadSpeedRpm',
      numeric: true,
      defaultVisible: true,
      cell: (p) => (p.category === 'motor' ? sig(p.params.noLoadSpeedRpm, 5) : ''),
    },
    {
      id: 'torque',
      label: 'Stall torque',
      unit: 'mN·m',
      sortKey: 'stallTorqueNm',
      numeric: true,
      defaultVisible: true,
      cell: (p) => (p.category === 'motor' ? sig(p.params.stallTorqueNm * 1000) : ''),
    },
    {
      id: 'stallI',
      label: 'Stall current',
      unit: 'A',
      sortKey: 'stallCurrentA',
      numeric: true,
      defaultVisible: true,
      cell: (p) => (p.category === 'motor' ? sig(p.params.stallCurrentA) : ''),
    },
    {
      id: 'noLoadI',
      label: 'No-load current',
      unit: 'A',
      numeric: true,
      cell: (p) => (p.category === 'motor' ? sig(p.params.noLoadCurrentA) : ''),
    },
  ],
};

const ANY_CATEGORY: SearchColumn[] = [
  { id: 'category', label: 'Category', defaultVisible: true, cell: (p) => CATEGORY_LABELS[p.category].one },
  { id: 'description', label: 'Description', defaultVisible: true, cell: (p) => p.description },
];

export function columnsFor(category: PartCategory | null): SearchColumn[] {
  if (!category) return [...COMMON_HEAD, ...ANY_CATEGORY, ...COMMON_TAIL.filter((c) => c.id !== 'description')];
  return [...COMMON_HEAD, ...CATEGORY_COLUMNS[category], ...COMMON_TAIL];
}
