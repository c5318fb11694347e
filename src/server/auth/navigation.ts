/**
 * The header's links: a link shows when its page exists and the policy lets the person open it, so each
 * role sees its own set and nothing points at a page that is not there yet. Add a page's link here.
 */
import { decide } from './policy.ts';
import { mailSinkIsLocal } from '../mail/config.ts';
import type { SessionUser } from './types.ts';

export interface NavLink {
  href: string;
  label: string;
}

interface NavEntry extends NavLink {
  /** Only while the local mail sink runs. */
  localMailOnly?: boolean;
}

const NAV: readonly NavEntry[] = [
  { href: '/', label: 'Catalogue' },
  { href: '/parts', label: 'Find parts' },
  { href: '/review', label: 'Review' },
  { href: '/designs', label: 'Designs' },
  { href: '/shortlist', label: 'Shortlist' },
  { href: '/quotes', label: 'Quote requests' },
  { href: '/calculators', label: 'Calculators' },
  { href: '/people', label: 'People' },
  { href: '/rates', label: 'Exchange rates' },
  { href: '/mail', label: 'Mail sink', localMailOnly: true },
];

/** Route patterns of the page files that exist (Vite lists them at build time; nothing is loaded). */
const PAGE_FILES = Object.keys(import.meta.glob('../../pages/**/*.astro'));

export function routeOfPageFile(file: string): string {
  const route = file
    .replace(/^.*\/pages/, '')
    .replace(/\.astro$/, '')
    .replace(/\/index$/, '');
  return route === '' ? '/' : route;
}

const EXISTING_PAGES: ReadonlySet<string> = new Set(PAGE_FILES.map(routeOfPageFile));

export function navFor(user: SessionUser | null, existing: ReadonlySet<string> = EXISTING_PAGES): NavLink[] {
  return NAV.filter((item) => existing.has(item.href))
    .filter((item) => !item.localMailOnly || mailSinkIsLocal())
    .filter((item) => decide(item.href, 'GET', user) === 'allow')
    .map(({ href, label }) => ({ href, label }));
}
