/**
 * The governing RDS(on) line per VGS interval, precomputed for the catalogue's RDS(on) filter.
 * Rule (README "Searching the catalogue"): at a drive V, the 25 °C line at the highest VGS not above V
 * bounds the resistance from above (RDS(on) falls as VGS rises). Between two neighbouring 25 °C lines at
 * VGS a < b, every drive a ≤ V < b is governed by the line at a; from the highest line upwards, by that line.
 * Below the lowest line the part is not characterised, so no interval covers it.
 */
import type { RdsOnSpecPoint } from './domain/parts.ts';

export interface GoverningRdsOnInterval {
  /** Lowest drive of the interval (inclusive), V: the VGS of the governing line. */
  vgsFromV: number;
  /** Highest drive of the interval (exclusive), V; null for the open interval above the highest line. */
  vgsToV: number | null;
  /** Maximum RDS(on) of the governing line, ohm. */
  maxOhm: number;
}

/** Lines measured at Tj = 25 °C (within a kelvin), as the filter has always counted them. */
export const isAt25C = (p: Pick<RdsOnSpecPoint, 'tjC'>): boolean => p.tjC >= 24 && p.tjC <= 26;

/**
 * The intervals of one MOSFET, lowest drive first. Two 25 °C lines at the same VGS (24 °C and 25 °C, say)
 * make one interval with the lower maximum: the part qualifies when either line does.
 */
export function governingRdsOnIntervals(points: readonly RdsOnSpecPoint[]): GoverningRdsOnInterval[] {
  const byVgs = new Map<number, number>();
  for (const p of points) {
    if (!isAt25C(p)) continue;
    const seen = byVgs.get(p.vgsV);
    byVgs.set(p.vgsV, seen === undefined ? p.maxOhm : Math.min(seen, p.maxOhm));
  }
  const vgs = [...byVgs.keys()].sort((a, b) => a - b);
  return vgs.map((v, i) => ({ vgsFromV: v, vgsToV: i + 1 < vgs.length ? vgs[i + 1] : null, maxOhm: byVgs.get(v)! }));
}

/** The governing maximum RDS(on) at a drive, or null when no 25 °C line lies at or below it. */
export function governingMaxOhmAt(intervals: readonly GoverningRdsOnInterval[], driveV: number): number | null {
  const hit = intervals.find((i) => i.vgsFromV <= driveV && (i.vgsToV === null || driveV < i.vgsToV));
  return hit ? hit.maxOhm : null;
}
