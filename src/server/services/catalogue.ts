/**
 * Catalogue reads for pages: sizes that do not grow with the catalogue (counts and a few rows), read on the
 * replica when there is one (src/server/db.ts onReadDb).
 */
import { onReadDb } from '../db.ts';
import { countPartsByCategory, recentlyChangedParts, type RecentPart } from '../repos/parts.ts';
import { PART_CATEGORIES, type PartCategory } from '../../lib/domain/parts.ts';

/** Rows of recent changes per category on the home page. */
export const RECENT_PER_CATEGORY = 5;

export interface CatalogueOverview {
  counts: Record<PartCategory, number>;
  recent: Record<PartCategory, RecentPart[]>;
}

export async function catalogueOverview(): Promise<CatalogueOverview> {
  const [counts, ...recent] = await onReadDb((k) =>
    Promise.all([countPartsByCategory(k), ...PART_CATEGORIES.map((c) => recentlyChangedParts(k, c, RECENT_PER_CATEGORY))]),
  );
  return { counts, recent: Object.fromEntries(PART_CATEGORIES.map((c, i) => [c, recent[i]])) as CatalogueOverview['recent'] };
}
