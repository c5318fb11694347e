/** The catalogue a design is ranked against: the bounds from its worst case, the parts from the repo. */
import type { Db } from '../db.ts';
import type { MatchCatalogue, PreparedCase } from '../../lib/design-match.ts';
import { driverSupplyOf } from '../../lib/driver-ranking.ts';
import { loadCandidateParts, type CandidateBounds } from '../repos/part-candidates.ts';

/** The hard rating limits of a design (pure). */
export function candidateBounds({ designCase, worstCase }: PreparedCase): CandidateBounds {
  const driverSupply = driverSupplyOf(designCase);
  return {
    supplyMaxV: worstCase.supplyMaxV,
    stallCurrentMaxA: worstCase.stallCurrentMaxA,
    driverSupplyMinV: driverSupply.minV,
    driverSupplyMaxV: driverSupply.maxV,
  };
}

export async function loadCandidates(db: Db, prepared: PreparedCase, includePending: boolean): Promise<MatchCatalogue> {
  const { mosfets, drivers, diodes, totals } = await loadCandidateParts(db, candidateBounds(prepared), includePending);
  return {
    mosfets,
    drivers,
    diodes,
    excluded: { switch: totals.mosfet - mosfets.length, driver: totals.driver - drivers.length, diode: totals.diode - diodes.length },
  };
}
