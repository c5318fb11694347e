/**
 * Near misses of a parametric search that found nothing: for each part of the category (the bounds left
 * off), how far each numeric bound misses, as "RDS(on) at 4.5 V 85 mΩ, needs ≤ 60 mΩ". The rules are
 * the list's own (src/server/repos/part-search.ts): RDS(on) is the governing 25 °C line at the drive.
 * Pure: the service loads the parts without the bounds and passes them in.
 */
import type { Part } from './domain/parts.ts';
import { governingMaxOhmAt, governingRdsOnIntervals } from './rdson-governing.ts';
import { checkQuantity } from './compare.ts';
import { quantity } from './units.ts';

/** The numeric bounds of GET /api/parts the hint reads (others narrow the relaxed list as they are). */
export interface SearchBounds {
  vdsMinV?: number;
  vgsThMaxV?: number;
  rdsOnMaxOhm?: number;
  rdsOnAtVgsV?: number;
  idMinA?: number;
  qgMaxNc?: number;
  vrrmMinV?: number;
  ifAvMinA?: number;
  trrMaxNs?: number;
  ratedVoltageMinV?: number;
  ratedVoltageMaxV?: number;
  noLoadSpeedMinRpm?: number;
  stallTorqueMinNm?: number;
}

export const SEARCH_BOUND_KEYS = [
  'vdsMinV',
  'vgsThMaxV',
  'rdsOnMaxOhm',
  'idMinA',
  'qgMaxNc',
  'vrrmMinV',
  'ifAvMinA',
  'trrMaxNs',
  'ratedVoltageMinV',
  'ratedVoltageMaxV',
  'noLoadSpeedMinRpm',
  'stallTorqueMinNm',
] as const satisfies readonly (keyof SearchBounds)[];

interface Bound {
  label: string;
  unit: string;
  sense: 'at-most' | 'at-least';
  limit: number;
  /** The part's value; null when the part has none for it (not characterised there). */
  value: (p: Part) => number | null;
}

function boundsOf(b: SearchBounds): Bound[] {
  const out: Bound[] = [];
  const add = (limit: number | undefined, bound: Omit<Bound, 'limit'>) => limit !== undefined && out.push({ ...bound, limit });
  const m = (p: Part) => (p.category === 'mosfet' ? p.params : null);
  const d = (p: Part) => (p.category === 'diode' ? p.params : null);
  const w = (p: Part) => (p.category === 'motor' ? p.params : null);
  add(b.vdsMinV, { label: 'VDS max', unit: 'V', sense: 'at-least', value: (p) => m(p)?.vdsMaxV ?? null });
  add(b.vgsThMaxV, { label: 'VGS(th) max', unit: 'V', sense: 'at-most', value: (p) => m(p)?.vgsThMaxV ?? null });
  if (b.rdsOnMaxOhm !== undefined && b.rdsOnAtVgsV !== undefined) {
    const vgs = b.rdsOnAtVgsV;
    add(b.rdsOnMaxOhm, {
      label: `RDS(on) at ${quantity(vgs, 'V')}`,
      unit: 'Ω',
      sense: 'at-most',
      value: (p) => {
        const mp = m(p);
        return mp ? governingMaxOhmAt(governingRdsOnIntervals(mp.rdsOn), vgs) : null;
      },
    });
  }
  add(b.idMinA, { label: 'ID continuous', unit: 'A', sense: 'at-least', value: (p) => m(p)?.idContinuousA ?? null });
  add(b.qgMaxNc, { label: 'Qg total', unit: 'nC', sense: 'at-most', value: (p) => m(p)?.qgTotalNc ?? null });
  add(b.vrrmMinV, { label: 'VRRM', unit: 'V', sense: 'at-least', value: (p) => d(p)?.vrrmV ?? null });
  add(b.ifAvMinA, { label: 'IF(AV)', unit: 'A', sense: 'at-least', value: (p) => d(p)?.ifAvA ?? null });
  add(b.trrMaxNs, {
    label: 'trr',
    unit: 'ns',
    sense: 'at-most',
    // A Schottky without a trr has no stored charge: it meets any trr bound (the list's rule).
    value: (p) => {
      const dp = d(p);
      return dp ? (dp.trrNs ?? (dp.kind === 'schottky' ? 0 : null)) : null;
    },
  });
  add(b.ratedVoltageMinV, { label: 'Rated voltage', unit: 'V', sense: 'at-least', value: (p) => w(p)?.ratedVoltageV ?? null });
  add(b.ratedVoltageMaxV, { label: 'Rated voltage', unit: 'V', sense: 'at-most', value: (p) => w(p)?.ratedVoltageV ?? null });
  add(b.noLoadSpeedMinRpm, { label: 'No-load speed', unit: 'rpm', sense: 'at-least', value: (p) => w(p)?.noLoadSpeedRpm ?? null });
  add(b.stallTorqueMinNm, { label: 'Stall torque', unit: 'N·m', sense: 'at-least', value: (p) => w(p)?.stallTorqueNm ?? null });
  return out;
}

export interface SearchNearMiss {
  partId: number;
  mpn: string;
  manufacturer: string;
  /** Each bound the part misses: "RDS(on) at 4.5 V 85 mΩ, needs ≤ 60 mΩ". */
  misses: string[];
  /** Largest relative distance to a bound (|value − bound| / |bound|); Infinity for a missing value. */
  worstShortfall: number;
}

const fmtValue = (v: number, unit: string) => (unit === 'N·m' || unit === 'rpm' ? quantity(v, unit) : checkQuantity(v, unit));

/** The closest parts to the bounds, smallest worst miss first, then fewest misses, then part number. */
export function searchNearMisses(parts: readonly Part[], bounds: SearchBounds, count = 3): SearchNearMiss[] {
  const list = boundsOf(bounds);
  if (list.length === 0) return [];
  const out: SearchNearMiss[] = [];
  for (const p of parts) {
    const misses: string[] = [];
    let worst = 0;
    for (const b of list) {
      const v = b.value(p);
      const needs = `needs ${b.sense === 'at-most' ? '≤' : '≥'} ${fmtValue(b.limit, b.unit)}`;
      if (v == null) {
        misses.push(`${b.label} not characterised, ${needs}`);
        worst = Infinity;
        continue;
      }
      const ok = b.sense === 'at-most' ? v <= b.limit : v >= b.limit;
      if (ok) continue;
      misses.push(`${b.label} ${fmtValue(v, b.unit)}, ${needs}`);
      worst = Math.max(worst, b.limit === 0 ? Infinity : Math.abs(v - b.limit) / Math.abs(b.limit));
    }
    if (misses.length > 0 && p.id != null)
      out.push({ partId: p.id, mpn: p.mpn, manufacturer: p.manufacturer, misses, worstShortfall: worst });
  }
  return out
    .sort((a, b) => a.worstShortfall - b.worstShortfall || a.misses.length - b.misses.length || a.mpn.localeCompare(b.mpn))
    .slice(0, count);
}
