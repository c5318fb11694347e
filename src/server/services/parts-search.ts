/**
 * The catalogue list: parameter filters in SQL (repos/part-search.ts documents each rule), then an
 * optional text match: indexed lookups gather at most a few hundred candidates from the whole
 * catalogue (part number exact, prefix, either half; FULLTEXT words and their stems), an exact part
 * number comes first, fuse.js orders the rest and drops what does not resemble the text; then one page.
 */
import Fuse from 'fuse.js';
import { onReadDb } from '../db.ts';
import type { Knex } from 'knex';
import type { Part } from '../../lib/domain/parts.ts';
import type { PartListPage } from '../../lib/schemas/parts.ts';
import {
  filteredIdsPage,
  filteredPageAndCount,
  sortIds,
  textCandidates,
  type ScopedPartQuery,
  type SearchTextRow,
} from '../repos/part-search.ts';
import { loadPartsByIds } from '../repos/part-writes.ts';
import { SEARCH_BOUND_KEYS, searchNearMisses, type SearchNearMiss } from '../../lib/search-near-miss.ts';

/** How many parts of the category, bounds left off, the near-miss hint weighs. */
const NEAR_MISS_POOL = 500;

/** fuse.js score limit (0 exact … 1 anything): one or two wrong characters in a part number still match. */
const FUZZY_THRESHOLD = 0.3;

export function fuzzyMatch(rows: SearchTextRow[], text: string, keepOrder: boolean): number[] {
  const fuse = new Fuse(rows, {
    keys: [
      { name: 'mpn', weight: 3 },
      { name: 'manufacturer', weight: 1 },
      { name: 'description', weight: 1 },
    ],
    threshold: FUZZY_THRESHOLD,
    ignoreLocation: true,
    includeScore: true,
  });
  const hits = fuse.search(text);
  if (keepOrder) hits.sort((a, b) => a.refIndex - b.refIndex);
  return hits.map((h) => h.item.id);
}

/**
 * All ids the query selects, in order (text relevance unless a sort was asked for). Without text: every
 * filtered part. Read on the replica when there is one (src/server/db.ts onReadDb).
 */
export function matchingIds(query: ScopedPartQuery, limit?: number): Promise<number[]> {
  return onReadDb((k) => matchingIdsOn(k, query, limit));
}

async function matchingIdsOn(k: Knex, query: ScopedPartQuery, limit?: number): Promise<number[]> {
  if (!query.q) {
    const ids = await filteredIdsPage(k, query, 0, limit ?? Number.MAX_SAFE_INTEGER);
    return ids;
  }
  const rows = await textCandidates(k, query, query.q);
  const exact = rows.filter((r) => r.exact).map((r) => r.id);
  const exactSet = new Set(exact);
  const fuzzy = fuzzyMatch(rows, query.q, false).filter((id) => !exactSet.has(id));
  const ids = [...exact, ...fuzzy];
  const ordered = query.sort !== undefined ? await sortIds(k, query, ids) : ids;
  return limit === undefined ? ordered : ordered.slice(0, limit);
}

/**
 * The list as the viewer may see it: pass the query with listingScope(user) (services/parts-access.ts).
 * Read on the replica when there is one, ids and rows from the same database. When nothing meets every
 * numeric bound, the answer adds the closest parts and what they miss (nearMissesOf).
 */
export async function searchParts(query: ScopedPartQuery): Promise<PartListPage<Part> & { nearMisses?: SearchNearMiss[] }> {
  const page = await onReadDb(async (k): Promise<PartListPage<Part>> => {
    const offset = (query.page - 1) * query.pageSize;
    if (!query.q) {
      const { ids, total } = await filteredPageAndCount(k, query, offset, query.pageSize);
      return { items: await loadPartsByIds(k, ids), total, page: query.page, pageSize: query.pageSize };
    }
    const ids = await matchingIdsOn(k, query);
    const pageIds = ids.slice(offset, offset + query.pageSize);
    return { items: await loadPartsByIds(k, pageIds), total: ids.length, page: query.page, pageSize: query.pageSize };
  });
  if (page.total > 0 || !SEARCH_BOUND_KEYS.some((key) => query[key] !== undefined)) return page;
  return { ...page, nearMisses: await nearMissesOf(query) };
}

/**
 * Nothing meets every bound: the closest parts the person may see, with the same text, category and
 * other filters but the numeric bounds left off, and what each misses.
 */
function nearMissesOf(query: ScopedPartQuery): Promise<SearchNearMiss[]> {
  const relaxed: ScopedPartQuery = { ...query, rdsOnAtVgsV: undefined, sort: undefined };
  for (const key of SEARCH_BOUND_KEYS) relaxed[key] = undefined;
  return onReadDb(async (k) => searchNearMisses(await loadPartsByIds(k, await matchingIdsOn(k, relaxed, NEAR_MISS_POOL)), query));
}
