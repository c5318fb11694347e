/**
 * The one place for role rules: every page and API route, keyed by its Astro route pattern (the file
 * path under src/pages, e.g. `/api/people/[id]/roles`), says who may use it. Deny by default: a route
 * or method without a rule is refused. Admins may use every route that names roles.
 * OWASP ASVS 5.0 V8.1.1 (documented access rules), V8.2.1 (function-level), V8.3.1 (enforced server-side).
 */
import type { Role, SessionUser } from './types.ts';

/** `public`: anyone; `signed-in`: any person signed in; a role list: people holding one of them (or admin). */
export type Access = 'public' | 'signed-in' | readonly Role[];
export const METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;
export type Method = (typeof METHODS)[number];
/** One access for every method, or one per method (a method left out is refused with 405). */
export type RouteRule = Access | Partial<Record<Method, Access>>;

const ADMIN: readonly Role[] = ['admin'];

export const ROUTE_RULES: Readonly<Record<string, RouteRule>> = {
  // Framework routes: the not-found and error pages.
  '/404': 'public',
  '/500': 'public',

  // Pages
  '/': 'signed-in',
  '/calculators': 'public',
  '/signin': 'public',
  '/reset': 'public',
  '/invite': 'public',
  '/account': 'signed-in',
  '/account/no-access': 'signed-in',
  '/people': ADMIN,
  '/mail': ADMIN,
  '/rates': ADMIN,

  // API
  '/api/health': { GET: 'public' },
  '/api/calc/motor': { POST: 'public' },
  '/api/calc/pull-resistor': { POST: 'public' },
  '/api/calc/switch': { POST: 'public' },
  '/api/calc/supply': { POST: 'public' },
  '/api/auth/signin': { POST: 'public' },
  '/api/auth/signout': { POST: 'public' },
  '/api/auth/signout-everywhere': { POST: 'signed-in' },
  '/api/auth/me': { GET: 'signed-in' },
  '/api/auth/password': { POST: 'signed-in' },
  '/api/auth/reset-request': { POST: 'public' },
  '/api/auth/reset': { POST: 'public' },
  '/api/auth/invite-accept': { POST: 'public' },
  '/api/people': { GET: ADMIN, POST: ADMIN },
  '/api/people/[id]/roles': { PUT: ADMIN },
  '/api/people/[id]/deactivate': { POST: ADMIN },
  '/api/people/[id]/reactivate': { POST: ADMIN },
  '/api/people/[id]/invite': { POST: ADMIN },
  // Exchange rates: everyone signed in reads them (the shortlist shows them); admins keep them.
  '/api/rates': { GET: 'signed-in', PUT: ADMIN },

  // Designs: designers own them (the owner check lives in the design service); everyone signed in reads.
  '/designs': 'signed-in',
  '/designs/new': ['designer'],
  '/designs/[id]': 'signed-in',
  '/designs/[id]/compare': 'signed-in',
  '/shortlist': ['buyer', 'designer'],
  '/api/designs': { GET: 'signed-in', POST: ['designer'] },
  '/api/designs/match': { POST: 'signed-in' },
  '/api/designs/[id]': { GET: 'signed-in', PUT: ['designer'] },
  '/api/designs/[id]/match': { POST: 'signed-in' },
  '/api/designs/[id]/compare': { GET: 'signed-in' },
  '/api/designs/[id]/status': { POST: ['designer'] },
  '/api/designs/[id]/report.pdf': { GET: 'signed-in' },
  '/api/designs/[id]/bom.csv': { GET: 'signed-in' },
  '/api/shortlist': { GET: ['buyer', 'designer'] },
  '/api/shortlist.csv': { GET: ['buyer', 'designer'] },
  // A buyer's preferred source and note per shortlist option; designers read them on the shortlist and the design.
  '/api/designs/[id]/preferences': { PUT: ['buyer'] },
  '/api/alerts/[id]/acknowledge': { POST: 'signed-in' },
  // Requests for quotation and the supplier contacts they go to: buyers alone (and admins).
  '/quotes': ['buyer'],
  '/quotes/[id]': ['buyer'],
  '/api/suppliers': { GET: ['buyer'], POST: ['buyer'] },
  '/api/suppliers/[id]': { PUT: ['buyer'] },
  '/api/quotes': { GET: ['buyer'], POST: ['buyer'] },
  '/api/quotes/[id]': { GET: ['buyer'] },
  '/api/quotes/[id]/answer': { POST: ['buyer'] },
  '/api/quotes/[id]/close': { POST: ['buyer'] },

  // Catalogue: everyone signed in reads; designers propose parts (the service makes them pending and lets a
  // proposer revise only their own); librarians curate parts, datasheets, imports, review and lifecycle;
  // buyers keep supply data.
  '/parts': 'signed-in',
  '/parts/[id]': 'signed-in',
  '/parts/new': ['designer', 'librarian'],
  '/parts/[id]/edit': ['designer', 'librarian'],
  '/parts/import': ['librarian'],
  '/review': ['librarian'],
  '/api/parts': { GET: 'signed-in', POST: ['designer', 'librarian'] },
  '/api/parts.csv': { GET: 'signed-in' },
  '/api/parts/[id]': { GET: 'signed-in', PUT: ['designer', 'librarian'], DELETE: ['librarian'] },
  '/api/parts/[id]/review': { POST: ['librarian'] },
  '/api/parts/[id]/lifecycle': { POST: ['librarian'] },
  '/api/parts/[id]/sources': { PUT: ['buyer', 'librarian'] },
  '/api/parts/[id]/datasheets': { POST: ['librarian'] },
  '/api/datasheets/[id]': { GET: 'signed-in', DELETE: ['librarian'] },
  '/api/imports': { POST: ['librarian'] },
  // Distributor offers: buyers (and admins) ask for a refresh now; the scheduled one needs nobody.
  '/api/distributor/refresh': { POST: ['buyer'] },
};

export type Decision = 'allow' | 'sign-in' | 'forbidden' | 'method-not-allowed';

function isAccess(rule: RouteRule): rule is Access {
  return typeof rule === 'string' || Array.isArray(rule);
}

/** The access for a route and method; undefined when there is no rule (which means: refused). */
export function accessFor(routePattern: string, method: string, rules = ROUTE_RULES): Access | undefined {
  const rule = rules[routePattern];
  if (rule === undefined) return undefined;
  if (isAccess(rule)) return rule;
  const m = (method === 'HEAD' ? 'GET' : method.toUpperCase()) as Method;
  return rule[m];
}

export function allowedMethods(routePattern: string, rules = ROUTE_RULES): Method[] {
  const rule = rules[routePattern];
  if (rule === undefined) return [];
  return isAccess(rule) ? [...METHODS] : METHODS.filter((m) => rule[m] !== undefined);
}

export function permits(access: Access, user: SessionUser | null): boolean {
  if (access === 'public') return true;
  if (!user) return false;
  if (access === 'signed-in') return true;
  return user.roles.includes('admin') || user.roles.some((r) => access.includes(r));
}

export function decide(routePattern: string, method: string, user: SessionUser | null, rules = ROUTE_RULES): Decision {
  if (rules[routePattern] !== undefined && method !== 'OPTIONS') {
    const access = accessFor(routePattern, method, rules);
    if (access === undefined) return 'method-not-allowed';
    if (permits(access, user)) return 'allow';
  }
  return user ? 'forbidden' : 'sign-in';
}

export function isApiRoute(routePattern: string): boolean {
  return routePattern === '/api' || routePattern.startsWith('/api/');
}
