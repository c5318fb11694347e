/** The catalogue a design is ranked against: the bounds from its worst case, the parts from the repo. */
import type { Db } from '../db.ts';
import type { MatchCatalogue, PreparedCase } from '../../lib/design-match.ts';
import type { PriceSource } from '../../lib/domain/parts.ts';
import { driverSupplyOf } from '../../lib/driver-ranking.ts';
import { candidatePriceSources, loadCandidateParts, type CandidateBounds } from '../repos/part-candidates.ts';
import { candidatesOf, currentCandidates, priceSourcesFrom, type CandidateSnapshot } from './candidate-cache.ts';

/** The in-memory snapshot a match's catalogue came from, so its pricing reads the same one. */
const snapshotOf = new WeakMap<MatchCatalogue, CandidateSnapshot>();

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
  const bounds = candidateBounds(prepared, phase, switchPickIds, boardQuantity);
  const snapshot = await currentCandidates(db);
  const { mosfets, drivers, diodes, totals } = snapshot
    ? candidatesOf(snapshot, bounds, includePending)
    : await loadCandidateParts(db, bounds, includePending, prices);
  const catalogue: MatchCatalogue = {
    mosfets,
    drivers,
    diodes,
    excluded: { switch: totals.mosfet - mosfets.length, driver: totals.driver - drivers.length, diode: totals.diode - diodes.length },
  };
  if (snapshot) {
    snapshotOf.set(catalogue, snapshot);
    if (prices) fillSources(catalogue, priceSourcesFrom(snapshot, idsOf(catalogue), boardQuantity), null);
  }
  return catalogue;
}

const idsOf = (catalogue: MatchCatalogue): number[] =>
  [...catalogue.mosfets, ...catalogue.drivers, ...catalogue.diodes].flatMap((p) => (p.id == null ? [] : [p.id]));

/**
 * Puts the priced parts in the catalogue's lists as copies with their sources (the parts may be the
 * candidate cache's shared, frozen objects): `only` the given ids, or every part.
 */
function fillSources(catalogue: MatchCatalogue, sources: Map<number, PriceSource[]>, only: ReadonlySet<number> | null): void {
  const fill = <P extends { id?: number; sources: PriceSource[] }>(list: P[]) => {
    for (let i = 0; i < list.length; i++) {
      const part = list[i];
      if (part.id != null && (only == null || only.has(part.id))) list[i] = { ...part, sources: sources.get(part.id) ?? [] };
    }
  };
  fill(catalogue.mosfets);
  fill(catalogue.drivers);
  fill(catalogue.diodes);
}

/** Fills in the sources (price break at the build quantity) of the given candidates, loaded without prices. */
export async function priceCandidates(
  db: Db,
  catalogue: MatchCatalogue,
  partIds: ReadonlySet<number>,
  boardQuantity: number,
): Promise<void> {
  const snapshot = snapshotOf.get(catalogue);
  const sources = snapshot
    ? priceSourcesFrom(snapshot, partIds, boardQuantity)
    : await candidatePriceSources(db, [...partIds], boardQuantity);
  fillSources(catalogue, sources, partIds);
}
