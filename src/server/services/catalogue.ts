/** Catalogue reads for pages. */
import { db } from '../db.ts';
import { listParts } from '../repos/parts.ts';
import { PART_CATEGORIES, type Part, type PartCategory } from '../../lib/domain/parts.ts';

export type CatalogueGroups = Record<PartCategory, Part[]>;

export async function catalogueByCategory(): Promise<CatalogueGroups> {
  const parts = await listParts(db());
  const groups = Object.fromEntries(PART_CATEGORIES.map((c) => [c, [] as Part[]])) as CatalogueGroups;
  for (const part of parts) groups[part.category].push(part);
  return groups;
}
