/**
 * RDS(on) at a given gate drive and junction temperature, from datasheet spec points.
 */
import type { RdsOnSpecPoint } from './domain/parts.ts';
import { memoOnObject } from './memo.ts';

/** One RDS(on) line reduced to what the checks need: the maximum at a stated VGS, Tj = 25 °C. */
export interface RdsOnPoint {
  vgsV: number;
  ohms: number;
  /** Drain current the line was measured at, when stated: the line holds only up to about this current. */
  testCurrentA?: number | null;
}

/** Default RDS(on) temperature coefficient [mem: parts rise ×1.4–1.8 by 125–150 °C]. */
export const DEFAULT_RDSON_TEMPCO_PER_C = 0.005;

/** RDS(on)(Tj) = RDS(on),25·(1 + α·(Tj − 25)) [docs/engineering.md §5]. */
export function rdsOnAtTemperatureOhm(rdsOn25Ohm: number, junctionC: number, alphaPerC = DEFAULT_RDSON_TEMPCO_PER_C): number {
  return rdsOn25Ohm * (1 + alphaPerC * (junctionC - 25));
}

/**
 * Converts catalogue spec points to 25 °C maxima. Points stated at 25 °C are used as they are;
 * points at other temperatures are referred back to 25 °C with α, only when no 25 °C point exists at that VGS.
 */
export function rdsOnPointsAt25C(points: readonly RdsOnSpecPoint[], alphaPerC = DEFAULT_RDSON_TEMPCO_PER_C): RdsOnPoint[] {
  const at25 = points.filter((p) => Math.abs(p.tjC - 25) <= 1);
  const others = points
    .filter((p) => Math.abs(p.tjC - 25) > 1 && !at25.some((q) => q.vgsV === p.vgsV))
    .map((p) => ({ vgsV: p.vgsV, maxOhm: p.maxOhm / (1 + alphaPerC * (p.tjC - 25)), idA: p.idA }));
  return [...at25, ...others].map((p) => ({ vgsV: p.vgsV, ohms: p.maxOhm, testCurrentA: p.idA }));
}

/**
 * Ascending by VGS; duplicate VGS keep the larger (conservative) resistance. Worked out once per points
 * array (a match reads each part's lines at one or two drives, several times): the same array comes back.
 */
const normalise = memoOnObject((points: readonly RdsOnPoint[]) => normaliseOnce(points));

function normaliseOnce(points: readonly RdsOnPoint[]): RdsOnPoint[] {
  const byVgs = new Map<number, number>();
  for (const p of points) {
    if (p.vgsV > 0 && p.ohms > 0) byVgs.set(p.vgsV, Math.max(byVgs.get(p.vgsV) ?? 0, p.ohms));
  }
  return [...byVgs.entries()].sort((a, b) => a[0] - b[0]).map(([vgsV, ohms]) => ({ vgsV, ohms }));
}

/** The lowest VGS at which RDS(on) is specified: the least drive at which the part is usable. */
export function lowestSpecVgsV(points: readonly RdsOnPoint[]): number | null {
  const sorted = normalise(points);
  return sorted.length > 0 ? sorted[0].vgsV : null;
}

/**
 * RDS(on) at a drive voltage: ln R interpolated linearly in VGS between neighbouring spec points [docs/engineering.md §5];
 * above the highest point the highest point's value (no extrapolated gain); below the lowest: null, not characterised.
 */
export function rdsOnAtDriveOhm(points: readonly RdsOnPoint[], driveV: number): number | null {
  const sorted = normalise(points);
  if (sorted.length === 0 || !(driveV >= sorted[0].vgsV)) return null;
  const upperIndex = sorted.findIndex((p) => p.vgsV >= driveV);
  if (upperIndex === -1) return sorted[sorted.length - 1].ohms;
  const upper = sorted[upperIndex];
  if (upper.vgsV === driveV || upperIndex === 0) return upper.ohms;
  const lower = sorted[upperIndex - 1];
  const fraction = (driveV - lower.vgsV) / (upper.vgsV - lower.vgsV);
  return Math.exp(Math.log(lower.ohms) + fraction * (Math.log(upper.ohms) - Math.log(lower.ohms)));
}

/** The spec line that bounds RDS(on) at a drive: the one at the highest VGS not above it (null below the lowest). */
export function governingLineAt(points: readonly RdsOnPoint[], driveV: number): RdsOnPoint | null {
  let best: RdsOnPoint | null = null;
  for (const p of points) {
    if (!(p.vgsV > 0 && p.ohms > 0 && p.vgsV <= driveV)) continue;
    // The highest VGS not above the drive; of equal VGS, the larger (conservative) resistance, the first kept.
    if (best == null || p.vgsV > best.vgsV || (p.vgsV === best.vgsV && p.ohms > best.ohms)) best = p;
  }
  return best;
}
