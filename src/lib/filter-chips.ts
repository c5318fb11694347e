/**
 * The filters in force on the search page as removable chips ("VDS ≥ 30 V"): one chip per API
 * parameter (RDS(on) bound and its drive together, as the API needs both), read from the URL
 * parameters so a shared link shows the same chips. Removing a chip deletes its `keys`.
 */
import { bound } from './units.ts';
import { CATEGORY_LABELS } from './part-summary.ts';
import { LIFECYCLE_LABELS, REVIEW_LABELS } from './labels.ts';
import type { Lifecycle, PartCategory, ReviewStatus } from './domain/parts.ts';

export interface FilterChip {
  /** What the chip reads, e.g. "VDS ≥ 30 V". */
  label: string;
  /** The URL parameters removing the chip deletes. */
  keys: string[];
}

/** Parameters that are not filters: the text (it stays in the search box) and its reading, sorting, paging, format. */
const NOT_FILTERS = new Set(['q', 'units', 'sort', 'page', 'pageSize', 'format']);

const KIND_LABELS: Record<string, string> = {
  schottky: 'Schottky',
  ultrafast: 'Ultrafast',
  fast: 'Fast recovery',
  general: 'General purpose',
};

type Numeric = (v: number) => string;
const NUMERIC: Record<string, Numeric> = {
  vdsMinV: (v) => `VDS ≥ ${bound(v, 'V')}`,
  vgsThMaxV: (v) => `VGS(th) ≤ ${bound(v, 'V')}`,
  idMinA: (v) => `ID ≥ ${bound(v, 'A')}`,
  qgMaxNc: (v) => `Qg ≤ ${bound(v * 1e-9, 'C')}`,
  logicRailV: (v) => `Logic input at ${bound(v, 'V')}`,
  supplyV: (v) => `Supply ${bound(v, 'V')}`,
  outputHighMinV: (v) => `Output high ≥ ${bound(v, 'V')}`,
  vrrmMinV: (v) => `VRRM ≥ ${bound(v, 'V')}`,
  ifAvMinA: (v) => `IF(AV) ≥ ${bound(v, 'A')}`,
  trrMaxNs: (v) => `trr ≤ ${bound(v * 1e-9, 's')}`,
  ratedVoltageMinV: (v) => `Rated voltage ≥ ${bound(v, 'V')}`,
  ratedVoltageMaxV: (v) => `Rated voltage ≤ ${bound(v, 'V')}`,
  noLoadSpeedMinRpm: (v) => `No-load speed ≥ ${v} rpm`,
  stallTorqueMinNm: (v) => `Stall torque ≥ ${bound(v, 'N·m')}`,
};

function num(value: string): number | null {
  const v = Number(value);
  return value.trim() !== '' && Number.isFinite(v) ? v : null;
}

export function filterChips(params: URLSearchParams): FilterChip[] {
  const chips: FilterChip[] = [];
  const get = (k: string): string | null => {
    const v = params.get(k);
    return v === null || v.trim() === '' ? null : v;
  };
  const done = new Set<string>();
  for (const key of params.keys()) {
    if (NOT_FILTERS.has(key) || done.has(key)) continue;
    done.add(key);
    const value = get(key);
    if (value === null) continue;
    const n = num(value);
    if (key === 'category') {
      const c = CATEGORY_LABELS[value as PartCategory];
      chips.push({ label: c ? c.many : value, keys: ['category'] });
    } else if (key === 'channel') {
      chips.push({ label: value === 'n' ? 'N-channel' : value === 'p' ? 'P-channel' : `Channel ${value}`, keys: [key] });
    } else if (key === 'kind') {
      chips.push({ label: KIND_LABELS[value] ?? value, keys: [key] });
    } else if (key === 'inverting') {
      chips.push({ label: value === 'true' ? 'Inverting' : 'Non-inverting', keys: [key] });
    } else if (key === 'package') {
      chips.push({ label: `Package ${value}`, keys: [key] });
    } else if (key === 'lifecycle') {
      const names = value.split(',').map((s) => LIFECYCLE_LABELS[s.trim() as Lifecycle]?.short ?? s.trim());
      chips.push({ label: `Lifecycle: ${names.join(', ')}`, keys: [key] });
    } else if (key === 'reviewStatus') {
      const names = value.split(',').map((s) => REVIEW_LABELS[s.trim() as ReviewStatus]?.short ?? s.trim());
      chips.push({ label: `Review: ${names.join(', ')}`, keys: [key] });
    } else if (key === 'rdsOnMaxOhm' || key === 'rdsOnAtVgsV') {
      done.add('rdsOnMaxOhm').add('rdsOnAtVgsV');
      const maxOhm = num(get('rdsOnMaxOhm') ?? '');
      const driveV = num(get('rdsOnAtVgsV') ?? '');
      if (maxOhm !== null && driveV !== null) {
        chips.push({ label: `RDS(on) ≤ ${bound(maxOhm, 'Ω')} at VGS ${bound(driveV, 'V')}`, keys: ['rdsOnMaxOhm', 'rdsOnAtVgsV'] });
      } else if (driveV !== null) {
        chips.push({ label: `RDS(on) specified at VGS ≤ ${bound(driveV, 'V')}`, keys: ['rdsOnAtVgsV'] });
      } else {
        chips.push({ label: `RDS(on) ≤ ${get('rdsOnMaxOhm')} Ω (no drive given)`, keys: ['rdsOnMaxOhm'] });
      }
    } else if ((key === 'ratedVoltageMinV' || key === 'ratedVoltageMaxV') && get('ratedVoltageMinV') === get('ratedVoltageMaxV')) {
      done.add('ratedVoltageMinV').add('ratedVoltageMaxV');
      chips.push({ label: `Rated voltage ${n !== null ? bound(n, 'V') : value}`, keys: ['ratedVoltageMinV', 'ratedVoltageMaxV'] });
    } else if (NUMERIC[key] && n !== null) {
      chips.push({ label: NUMERIC[key](n), keys: [key] });
    } else {
      chips.push({ label: `${key} ${value}`, keys: [key] });
    }
  }
  return chips;
}
