/**
 * The catalogue candidates of a design, narrowed in SQL on indexed rating columns: only parts whose
 * ratings or gate-drive needs can never pass are left out (the engineering core would fail them on a
 * hard limit), with
 * obsolete parts (not for new designs) and parts not yet approved unless asked for.
 */
import type { Db } from '../db.ts';
import type { PartOf } from '../../lib/domain/parts.ts';
import { hydrateParts } from './parts.ts';
import type { DbPartRow } from './part-rows.ts';

/** The hard limits a candidate's ratings must reach (from the design's worst case). */
export interface CandidateBounds {
  /** Highest supply: a MOSFET's VDS(max) and a diode's VRRM must reach it. */
  supplyMaxV: number;
  /** Highest stall current: a MOSFET's pulsed drain current must reach it. */
  stallCurrentMaxA: number;
  /** The driver supply band: a driver's supply range must cover it. */
  driverSupplyMinV: number;
  driverSupplyMaxV: number;
  /**
   * The highest gate voltage the switch can see (the pin's logic high for direct drive, the driver
   * supply's top for a driver): a MOSFET whose lowest RDS(on) line or VGS(th) max lies above it fails
   * the gate-drive check at any drive there is, so it is left out. The picks are kept regardless.
   */
  switchGateMaxV: number;
  /** The design's switch picks: ranked whenever their ratings allow, whatever the gate drive. */
  switchPickIds: number[];
}

export interface CandidateRows {
  mosfets: PartOf<'mosfet'>[];
  drivers: PartOf<'driver'>[];
  diodes: PartOf<'diode'>[];
  /** Eligible parts of each category before the rating bounds (for "n left out"). */
  totals: { mosfet: number; driver: number; diode: number };
}

function eligible(db: Db, category: string, includePending: boolean) {
  return db<DbPartRow>('parts')
    .where('parts.category', category)
    .whereIn('parts.review_status', includePending ? ['approved', 'pending'] : ['approved'])
    .whereNot('parts.lifecycle', 'obsolete');
}

async function countOf(q: ReturnType<typeof eligible>): Promise<number> {
  const [{ n }] = await q.clone().clearSelect().count({ n: '*' });
  return Number(n);
}

/** The three candidate SELECTs (parts rows only; the benchmark times them bare against the whole match). */
export function candidateQueries(db: Db, bounds: CandidateBounds, includePending: boolean) {
  const mosfetAll = eligible(db, 'mosfet', includePending);
  const mosfetQ = mosfetAll
    .clone()
    .join('mosfet_params', 'mosfet_params.part_id', 'parts.id')
    .where('mosfet_params.channel', 'n')
    .where('mosfet_params.vds_max_v', '>=', bounds.supplyMaxV)
    .where('mosfet_params.id_pulsed_a', '>=', bounds.stallCurrentMaxA)
    .where((w) =>
      w
        .where((g) =>
          g
            .where('mosfet_params.min_rds_on_vgs_v', '<=', bounds.switchGateMaxV)
            .where('mosfet_params.vgs_th_max_v', '<=', bounds.switchGateMaxV),
        )
        .orWhereIn('parts.id', bounds.switchPickIds),
    )
    .select('parts.*');
  const driverAll = eligible(db, 'driver', includePending);
  const driverQ = driverAll
    .clone()
    .join('driver_params', 'driver_params.part_id', 'parts.id')
    .where('driver_params.supply_min_v', '<=', bounds.driverSupplyMinV)
    .where('driver_params.supply_max_v', '>=', bounds.driverSupplyMaxV)
    .select('parts.*');
  const diodeAll = eligible(db, 'diode', includePending);
  const diodeQ = diodeAll
    .clone()
    .join('diode_params', 'diode_params.part_id', 'parts.id')
    .where('diode_params.vrrm_v', '>=', bounds.supplyMaxV)
    .select('parts.*');
  return { mosfetAll, mosfetQ, driverAll, driverQ, diodeAll, diodeQ };
}

export async function loadCandidateParts(db: Db, bounds: CandidateBounds, includePending: boolean): Promise<CandidateRows> {
  const { mosfetAll, mosfetQ, driverAll, driverQ, diodeAll, diodeQ } = candidateQueries(db, bounds, includePending);
  const [mosfetRows, driverRows, diodeRows, mosfet, driver, diode] = await Promise.all([
    mosfetQ,
    driverQ,
    diodeQ,
    countOf(mosfetAll),
    countOf(driverAll),
    countOf(diodeAll),
  ]);
  // One hydration for all three lists: its queries run once, not once per category.
  const parts = await hydrateParts(db, [...mosfetRows, ...driverRows, ...diodeRows] as DbPartRow[]);
  return {
    mosfets: parts.filter((p): p is PartOf<'mosfet'> => p.category === 'mosfet'),
    drivers: parts.filter((p): p is PartOf<'driver'> => p.category === 'driver'),
    diodes: parts.filter((p): p is PartOf<'diode'> => p.category === 'diode'),
    totals: { mosfet, driver, diode },
  };
}
