/**
 * The words and icons for each state, one table per enum, used by islands, pages, the report and the CSVs.
 * States are always shown with a word and an icon, never by colour alone.
 */
import { LIFECYCLES, type Lifecycle, type ReviewStatus } from './domain/parts.ts';

export interface StateLabel {
  /** Short word for tables and tags. */
  short: string;
  /** Full words for forms and the part page. */
  long: string;
  /** A glyph that tells the state apart without colour. */
  icon: string;
}

export const LIFECYCLE_LABELS: Readonly<Record<Lifecycle, StateLabel>> = {
  active: { short: 'Active', long: 'Active', icon: '●' },
  nrnd: { short: 'NRND', long: 'Not recommended for new designs (NRND)', icon: '◒' },
  'last-buy': { short: 'Last buy', long: 'Last-time buy', icon: '◔' },
  obsolete: { short: 'Obsolete', long: 'Obsolete', icon: '○' },
};

/** Lifecycle options in their natural order, for selects. */
export const LIFECYCLE_OPTIONS: readonly { value: Lifecycle; label: string }[] = LIFECYCLES.map((value) => ({
  value,
  label: LIFECYCLE_LABELS[value].long,
}));

export const REVIEW_LABELS: Readonly<Record<ReviewStatus, StateLabel>> = {
  approved: { short: 'Approved', long: 'Approved', icon: '✓' },
  pending: { short: 'Pending review', long: 'Pending review', icon: '…' },
  draft: { short: 'Draft', long: 'Draft', icon: '✎' },
  rejected: { short: 'Rejected', long: 'Rejected in review', icon: '✕' },
};

/** "◒ NRND": icon and short word. */
export const lifecycleTag = (l: Lifecycle): string => `${LIFECYCLE_LABELS[l].icon} ${LIFECYCLE_LABELS[l].short}`;

/** The three part lines of a design, as the workspace, the BOM and the history name them. */
export const PART_ROLE_LABELS: Readonly<Record<'switch' | 'driver' | 'diode', string>> = {
  switch: 'Low-side switch',
  driver: 'Gate driver / level shifter',
  diode: 'Freewheel diode',
};
