/**
 * The catalogue list: parameter filters in SQL (repos/part-search.ts documents each rule), then an
 * optional text match: indexed lookups gather at most a few hundred candidates from the whole
 * catalogue (part number exact, prefix, either half; FULLTEXT words and their stems), an exact part
 * number comes first, fuse.js orders the rest and drops what does not resemble the text; then one page.
 */
import Fuse from 'fuse.js';
import { db } from '../db.ts';
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

/** All ids the query selects, in order (text relevance unless a sort was asked for). Without text: every filtered part. */
export async function matchingIds(query: ScopedPartQuery, limit?: number): Promise<number[]> {
  if (!query.q) {
    const ids = await filteredIdsPage(db(), query, 0, limit ?? Number.MAX_SAFE_INTEGER);
    return ids;
  }
  const rows = await textCandidates(db(), query, query.q);
  const exact = rows.filter((r) => r.exact).map((r) => r.id);
  const exactSet = new Set(exact);
  const fuzzy = fuzzyMatch(rows, query.q, false).filter((id) => !exactSet.has(id));
  const ids = [...exact, ...fuzzy];
  const ordered = query.sort !== undefined ? await sortIds(db(), query, ids) : ids;
  return limit === undefined ? ordered : ordered.slice(0, limit);
}

/** The list as the viewer may see it: pass the query with listingScope(user) (services/parts-access.ts). */
export async function searchParts(query: ScopedPartQuery): Promise<PartListPage<Part>> {
  const offset = (query.page - 1) * query.pageSize;
  if (!query.q) {
    const { ids, total } = await filteredPageAndCount(db(), query, offset, query.pageSize);
    return { items: await loadPartsByIds(db(), ids), total, page: query.page, pageSize: query.pageSize };
  }
  const ids = await matchingIds(query);
  const pageIds = ids.slice(offset, offset + query.pageSize);
  return { items: await loadPartsByIds(db(), pageIds), total: ids.length, page: query.page, pageSize: query.pageSize };
}
