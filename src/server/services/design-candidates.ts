/**
 * Loads the catalogue candidates for a design. Narrowing in SQL on indexed columns drops only parts whose
 * ratings can never pass (the engineering core would fail them on a hard limit) and obsolete parts
 * (not for new designs); everything else is ranked by the core.
 */
import type { Db } from '../db.ts';
import type { DesignInput } from '../../lib/domain/design.ts';
import type { MotorParams, PartOf } from '../../lib/domain/parts.ts';
import type { MatchCatalogue } from '../../lib/design-match.ts';
import { designCaseOf } from '../../lib/design-input.ts';
import { worstCaseOf } from '../../lib/design-case.ts';
import { driverSupplyOf } from '../../lib/driver-ranking.ts';
import { hydrateParts } from '../repos/parts.ts';
import type { DbPartRow } from '../repos/part-rows.ts';

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

export async function loadCandidates(db: Db, input: DesignInput, motor: MotorParams, includePending: boolean): Promise<MatchCatalogue> {
  const c = designCaseOf(input, motor);
  const wc = worstCaseOf(c);
  const driverSupply = driverSupplyOf(c);

  const mosfetAll = eligible(db, 'mosfet', includePending);
  const mosfetQ = mosfetAll
    .clone()
    .join('mosfet_params', 'mosfet_params.part_id', 'parts.id')
    .where('mosfet_params.channel', 'n')
    .where('mosfet_params.vds_max_v', '>=', wc.supplyMaxV)
    .where('mosfet_params.id_pulsed_a', '>=', wc.stallCurrentMaxA)
    .select('parts.*');
  const driverAll = eligible(db, 'driver', includePending);
  const driverQ = driverAll
    .clone()
    .join('driver_params', 'driver_params.part_id', 'parts.id')
    .where('driver_params.supply_min_v', '<=', driverSupply.minV)
    .where('driver_params.supply_max_v', '>=', driverSupply.maxV)
    .select('parts.*');
  const diodeAll = eligible(db, 'diode', includePending);
  const diodeQ = diodeAll
    .clone()
    .join('diode_params', 'diode_params.part_id', 'parts.id')
    .where('diode_params.vrrm_v', '>=', wc.supplyMaxV)
    .select('parts.*');

  const [mosfetRows, driverRows, diodeRows, mosfetTotal, driverTotal, diodeTotal] = await Promise.all([
    mosfetQ,
    driverQ,
    diodeQ,
    countOf(mosfetAll),
    countOf(driverAll),
    countOf(diodeAll),
  ]);
  // One hydration for all three lists: its six queries run once, not once per category.
  const parts = await hydrateParts(db, [...mosfetRows, ...driverRows, ...diodeRows] as DbPartRow[]);
  const mosfets = parts.filter((p): p is PartOf<'mosfet'> => p.category === 'mosfet');
  const drivers = parts.filter((p): p is PartOf<'driver'> => p.category === 'driver');
  const diodes = parts.filter((p): p is PartOf<'diode'> => p.category === 'diode');
  return {
    mosfets,
    drivers,
    diodes,
    excluded: {
      switch: mosfetTotal - mosfets.length,
      driver: driverTotal - drivers.length,
      diode: diodeTotal - diodes.length,
    },
  };
}
