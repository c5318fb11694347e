/**
 * Shared types for the invented Kestrel Fluidics demo catalogue.
 *
 * Everything under db/seeds/data is fiction: invented makers, invented distributors and invented
 * part numbers. Parameter values are chosen to be physically plausible and consistent with each other,
 * so that ranking and worst-case checks behave as they would on a real catalogue.
 */
import type { PartCategory, PartOf, PartSource } from '../../../src/lib/domain/parts';

/** A demo source as written in the data files: the order multiple may be left out (index.ts fills in the pack size). */
export type DemoSource = Omit<PartSource, 'orderMultiple'> & { orderMultiple?: number };

/** A part as written in the data files. */
export type DemoEntry<C extends PartCategory> = Omit<PartOf<C>, 'id' | 'version' | 'sources'> & { sources: DemoSource[] };

/** A catalogue part as the seed inserts it: the database assigns id and version. */
export type DemoPart<C extends PartCategory> = Omit<PartOf<C>, 'id' | 'version'>;

export interface DemoManufacturer {
  name: string;
  /** Short code used in the maker's part numbers. */
  code: string;
  website: string;
  /** Which catalogue categories the maker supplies. */
  categories: PartCategory[];
  /** Human-readable description of how the maker builds its part numbers. */
  mpnPattern: string;
  /** Regular expression every part number of this maker matches. */
  mpnRegex: RegExp;
}

export interface DemoDistributor {
  name: string;
  website: string;
  currency: 'USD' | 'EUR';
  /** Human-readable description of the distributor's stock-keeping-unit format. */
  skuPattern: string;
  skuRegex: RegExp;
}

/** Any demo part, kept as a proper union over the categories (Omit on a union would flatten it). */
export type AnyDemoPart = { [C in PartCategory]: DemoPart<C> }[PartCategory];
