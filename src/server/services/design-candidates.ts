/** The catalogue a design is ranked against: the bounds from its worst case, the parts from the repo. */
import type { Db } from '../db.ts';
import type { MatchCatalogue, PreparedCase } from '../../lib/design-match.ts';
import { driverSupplyOf } from '../../lib/driver-ranking.ts';
import { candidatePriceSources, loadCandidateParts, type CandidateBounds } from '../repos/part-candidates.ts';

/**
 * Which gate drive the switch candidates are narrowed for: `direct` keeps only MOSFETs the logic pin
 * can enhance (the rest fail gate drive there, whatever else they do); `driver` keeps every MOSFET a
 * driver on the design's driver supply could enhance.
 */
export type SwitchDrivePhase = 'direct' | 'driver';

/** The hard rating limits of a design (pure). */
export function candidateBounds(
  { designCase, worstCase }: PreparedCase,
  phase: SwitchDrivePhase = 'driver',
  switchPickIds: number[] = [],
  boardQuantity = 1,
): CandidateBounds {
  const driverSupply = driverSupplyOf(designCase);
  return {
    supplyMaxV: worstCase.supplyMaxV,
    stallCurrentMaxA: worstCase.stallCurrentMaxA,
    driverSupplyMinV: driverSupply.minV,
    driverSupplyMaxV: driverSupply.maxV,
    // A driver's output high is its supply less a drop, so never above the supply's top.
    switchGateMaxV: phase === 'direct' ? worstCase.gateDriveMinV : Math.max(worstCase.gateDriveMinV, driverSupply.maxV),
    switchPickIds,
    boardQuantity,
  };
}

export async function loadCandidates(
  db: Db,
  prepared: PreparedCase,
  includePending: boolean,
  phase: SwitchDrivePhase = 'driver',
  switchPickIds: number[] = [],
  boardQuantity = 1,
  prices = true,
): Promise<MatchCatalogue> {
  const { mosfets, drivers, diodes, totals } = await loadCandidateParts(
    db,
    candidateBounds(prepared, phase, switchPickIds, boardQuantity),
    includePending,
    prices,
  );
  return {
    mosfets,
    drivers,
    diodes,
    excluded: { switch: totals.mosfet - mosfets.length, driver: totals.driver - drivers.length, diode: totals.diode - diodes.length },
  };
}

/** Fills in the sources (price break at the build quantity) of the given candidates, loaded without prices. */
export async function priceCandidates(
  db: Db,
  catalogue: MatchCatalogue,
  partIds: ReadonlySet<number>,
  boardQuantity: number,
): Promise<void> {
  const sources = await candidatePriceSources(db, [...partIds], boardQuantity);
  for (const part of [...catalogue.mosfets, ...catalogue.drivers, ...catalogue.diodes]) {
    if (part.id != null && partIds.has(part.id)) part.sources = sources.get(part.id) ?? [];
  }
}
