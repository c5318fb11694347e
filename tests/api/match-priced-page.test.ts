/**
 * A match page prices only the tie groups that can show on it (idsNeedingPrice). Second method: the same
 * candidates as full part records (every source and every price break, hydrated as the part pages load
 * them) ranked and decorated by the engine with all prices, then cut to the same page. Both give the same
 * page (entries, order, ranks, prices, pins), the same counts and failure summary, and the same suggestions,
 * on every demo design, for small pages across every list and with a pick deep in the ranking; the routes'
 * lean page (matchPageOf) gives the same.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { appDb } from '../helpers/stack.ts';
import { hydrateParts } from '../../src/server/repos/parts.ts';
import { loadCandidates } from '../../src/server/services/design-candidates.ts';
import { matchInput, matchPageOf } from '../../src/server/services/designs.ts';
import { matchDesign, prepareCase, type MatchCatalogue } from '../../src/lib/design-match.ts';
import { MATCH_LIST_KEYS, pageMatch } from '../../src/lib/match-page.ts';
import { loadDesign } from '../../src/server/repos/designs.ts';
import type { DesignInput } from '../../src/lib/domain/design.ts';
import type { Part, PartOf } from '../../src/lib/domain/parts.ts';
import type { DbPartRow } from '../../src/server/repos/part-rows.ts';
import { demoDesigns } from '../../db/seeds/designs.ts';

const knex = appDb();
afterAll(() => knex.destroy());

async function fullRecords<T extends { id?: number }>(parts: T[]): Promise<Part[]> {
  const ids = parts.map((p) => p.id as number);
  const rows: DbPartRow[] = ids.length ? await knex('parts').whereIn('id', ids) : [];
  const byId = new Map((await hydrateParts(knex, rows)).map((p) => [p.id, p]));
  return ids.map((id) => byId.get(id) as Part);
}

/** The whole match with every part priced from its full record, through the same drive phases as the service. */
async function fullyPriced(input: DesignInput) {
  if (input.motor.source !== 'catalogue') throw new Error('catalogue motor expected');
  const motorPart = (await hydrateParts(knex, await knex('parts').where({ id: input.motor.partId })))[0] as PartOf<'motor'>;
  const label = `${motorPart.mpn} (${motorPart.manufacturer})`;
  const prepared = prepareCase(input, motorPart.params);
  const sel = input.selections.switch;
  const picks = [...(sel.chosenPartId != null ? [sel.chosenPartId] : []), ...sel.alternatePartIds];
  const full = async (phase: 'direct' | 'driver'): Promise<MatchCatalogue> => {
    const light = await loadCandidates(knex, prepared, false, phase, picks, input.boardQuantity);
    return {
      mosfets: (await fullRecords(light.mosfets)) as PartOf<'mosfet'>[],
      drivers: (await fullRecords(light.drivers)) as PartOf<'driver'>[],
      diodes: (await fullRecords(light.diodes)) as PartOf<'diode'>[],
      excluded: light.excluded,
    };
  };
  if (input.selections.driver.chosenPartId == null) {
    const direct = matchDesign(input, label, motorPart.params, await full('direct'), prepared);
    if (!direct.driverNeeded && direct.switch.some((e) => e.verdict === 'pass')) return direct;
  }
  return matchDesign(input, label, motorPart.params, await full('driver'), prepared);
}

describe.each(demoDesigns.map((d) => d.name))('priced pages of "%s"', (name) => {
  it('equal the pages of the fully priced ranking', async () => {
    const row = await knex('designs').where({ name }).first('id');
    const input = (await loadDesign(knex, row.id))!.input;
    const whole = await fullyPriced(input);
    const longest = Math.max(...MATCH_LIST_KEYS.map((k) => whole[k].length));
    // The comparison is not empty: some page shows a price.
    expect([...whole.switch, ...whole.diode].some((e) => e.priceAtQty != null)).toBe(true);
    for (const limit of [3, 25]) {
      for (let offset = 0; offset < longest; offset += limit) {
        const page = { offset, limit };
        const want = pageMatch(whole, input, page);
        expect(pageMatch(await matchInput(input, false, undefined, knex, page), input, page)).toEqual(want);
        // The routes' lean page (only the page's entries judged in full) is the same answer.
        expect(await matchPageOf(input, false, page, knex)).toEqual(want);
      }
    }
  });

  it('equal it with a pick at the end of the ranking (its tie group priced too)', async () => {
    const row = await knex('designs').where({ name }).first('id');
    const saved = (await loadDesign(knex, row.id))!.input;
    const list = (await fullyPriced(saved)).diode;
    const last = list[list.length - 1];
    if (!last?.partId) return;
    const input: DesignInput = {
      ...saved,
      selections: { ...saved.selections, diode: { chosenPartId: saved.selections.diode.chosenPartId, alternatePartIds: [last.partId] } },
    };
    const whole = await fullyPriced(input);
    const page = { offset: 0, limit: 2 };
    const got = pageMatch(await matchInput(input, false, undefined, knex, page), input, page);
    expect(got).toEqual(pageMatch(whole, input, page));
    expect(await matchPageOf(input, false, page, knex)).toEqual(got);
    expect(got.diode.some((e) => e.partId === last.partId && e.pinned)).toBe(true);
  });
});
