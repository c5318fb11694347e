/**
 * The catalogue list: parameter filters in SQL (repos/part-search.ts documents each rule), then an
 * optional typo-tolerant text match (fuse.js) over maker, part number and description, then one page.
 */
import Fuse from 'fuse.js';
import { db } from '../db.ts';
import type { Part } from '../../lib/domain/parts.ts';
import type { PartListPage } from '../../lib/schemas/parts.ts';
import { countFiltered, filteredIdsPage, filteredTextRows, type ScopedPartQuery, type SearchTextRow } from '../repos/part-search.ts';
import { loadPartsByIds } from '../repos/part-writes.ts';

/** The text match looks at this many filtered parts at most (the catalogue is far smaller). */
const TEXT_SEARCH_CEILING = 20_000;
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

/** All ids the query selects, in order (text relevance unless a sort was asked for). */
export async function matchingIds(query: ScopedPartQuery, limit = TEXT_SEARCH_CEILING): Promise<number[]> {
  const rows = await filteredTextRows(db(), query, limit);
  if (!query.q) return rows.map((r) => r.id);
  return fuzzyMatch(rows, query.q, query.sort !== undefined);
}

/** The list as the viewer may see it: pass the query with listingScope(user) (services/parts-access.ts). */
export async function searchParts(query: ScopedPartQuery): Promise<PartListPage<Part>> {
  const offset = (query.page - 1) * query.pageSize;
  if (!query.q) {
    const [total, ids] = await Promise.all([countFiltered(db(), query), filteredIdsPage(db(), query, offset, query.pageSize)]);
    return { items: await loadPartsByIds(db(), ids), total, page: query.page, pageSize: query.pageSize };
  }
  const ids = await matchingIds(query);
  const pageIds = ids.slice(offset, offset + query.pageSize);
  return { items: await loadPartsByIds(db(), pageIds), total: ids.length, page: query.page, pageSize: query.pageSize };
}
