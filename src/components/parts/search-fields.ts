/**
 * The search page's filter fields: what a person types (in display units) and the API key it becomes
 * (SI, unit in the name). The URL carries the API keys, so a shared link is also a valid API query.
 */
import { tidy } from '../../lib/units.ts';
import type { PartCategory } from '../../lib/domain/parts.ts';
import { LIFECYCLE_LABELS } from '../../lib/labels.ts';
import { LIFECYCLES } from '../../lib/domain/parts.ts';

export interface NumberField {
  type: 'number';
  key: string;
  label: string;
  unit: string;
  /** API value = typed value × scale (e.g. mΩ → Ω is 1e-3). */
  scale: number;
  hint?: string;
}

export interface ChoiceField {
  type: 'choice';
  key: string;
  label: string;
  options: { value: string; label: string }[];
}

export type FilterField = NumberField | ChoiceField;

const n = (key: string, label: string, unit: string, scale = 1, hint?: string): NumberField => ({
  type: 'number',
  key,
  label,
  unit,
  scale,
  hint,
});

export const CATEGORY_FIELDS: Record<PartCategory, FilterField[]> = {
  mosfet: [
    {
      type: 'choice',
      key: 'channel',
      label: 'Channel',
      options: [
        { value: 'n', label: 'N-channel' },
        { value: 'p', label: 'P-channel' },
      ],
    },
    n('vdsMinV', 'VDS max at least', 'V'),
    n('vgsThMaxV', 'VGS(th) max at most', 'V'),
    n('rdsOnAtVgsV', 'Gate drive VGS', 'V', 1, 'Keeps parts whose RDS(on) is specified at or below this drive'),
    n('rdsOnMaxOhm', 'RDS(on) at that drive at most', 'mΩ', 1e-3, 'Judged at the highest specified VGS not above the drive'),
    n('idMinA', 'ID continuous at least', 'A'),
    n('qgMaxNc', 'Qg at most', 'nC'),
  ],
  driver: [
    n('logicRailV', 'Input accepts logic at', 'V', 1, 'Logic high taken as this rail'),
    n('supplyV', 'Driver supply', 'V', 1, 'Must lie in the rated supply range'),
    n('outputHighMinV', 'Output high at least', 'V'),
    {
      type: 'choice',
      key: 'inverting',
      label: 'Polarity',
      options: [
        { value: 'false', label: 'Non-inverting' },
        { value: 'true', label: 'Inverting' },
      ],
    },
  ],
  diode: [
    {
      type: 'choice',
      key: 'kind',
      label: 'Kind',
      options: [
        { value: 'schottky', label: 'Schottky' },
        { value: 'ultrafast', label: 'Ultrafast' },
        { value: 'fast', label: 'Fast' },
        { value: 'general', label: 'General purpose' },
      ],
    },
    n('vrrmMinV', 'VRRM at least', 'V'),
    n('ifAvMinA', 'IF(AV) at least', 'A'),
    n('trrMaxNs', 'trr at most', 'ns', 1, 'Schottky parts (no recovery) pass'),
  ],
  motor: [
    n('ratedVoltageMinV', 'Rated voltage from', 'V'),
    n('ratedVoltageMaxV', 'Rated voltage to', 'V'),
    n('noLoadSpeedMinRpm', 'No-load speed at least', 'rpm'),
    n('stallTorqueMinNm', 'Stall torque at least', 'mN·m', 1e-3),
  ],
};

export const STATUS_FIELDS: ChoiceField[] = [
  {
    type: 'choice',
    key: 'lifecycle',
    label: 'Lifecycle',
    options: LIFECYCLES.map((value) => ({ value, label: LIFECYCLE_LABELS[value].short })),
  },
  {
    type: 'choice',
    key: 'reviewStatus',
    label: 'Review',
    options: [
      { value: 'approved', label: 'Approved' },
      { value: 'pending', label: 'Pending review' },
      { value: 'draft', label: 'Draft' },
      { value: 'rejected', label: 'Rejected' },
    ],
  },
];

/** API value (string in the URL) → what the input shows. */
export function toDisplay(field: NumberField, apiValue: string | null): string {
  if (apiValue === null || apiValue === '') return '';
  const v = Number(apiValue);
  return Number.isFinite(v) ? String(tidy(v / field.scale)) : apiValue;
}

/** What the person typed → API value for the URL ('' clears the filter). */
export function toApi(field: NumberField, typed: string): string {
  const t = typed.trim().replace(',', '.');
  if (t === '') return '';
  const v = Number(t);
  return Number.isFinite(v) ? String(tidy(v * field.scale)) : t;
}

/** Filters in force, as the folded panel counts them: every parameter but the text search, the sort and the paging. */
export function activeFilterCount(params: URLSearchParams): number {
  const ignored = new Set(['q', 'sort', 'page', 'pageSize']);
  return new Set([...params.keys()].filter((k) => !ignored.has(k) && params.get(k) !== '')).size;
}
