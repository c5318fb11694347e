/**
 * The role matrix, written out by hand from README "Roles" (not derived from the policy module under
 * test): every page and API route, every method it serves, asked as anonymous, designer, librarian, buyer
 * and admin. `a` allowed (and never a 5xx), `s` sign-in first (401 on the API, a redirect to /signin for
 * a page), `f` forbidden (403). A route file without a row here fails.
 * OWASP ASVS 5.0 V8.1.1 (access rules documented in one place), V8.2.1 (function-level access),
 * V8.3.1 (enforced on the server, deny by default).
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appDb, appUrl } from '../helpers/stack.ts';
import { decide } from '../../src/server/auth/policy.ts';
import type { Role, SessionUser } from '../../src/server/auth/types.ts';
import { demoEmail, sessionCookie } from './auth-helpers.ts';
const PAGES_DIR = path.join(process.cwd(), 'src', 'pages');
const HTTP_METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;

interface RouteFile {
  file: string;
  pattern: string;
  api: boolean;
  methods: string[];
}

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = path.join(dir, name);
    return statSync(p).isDirectory() ? walk(p) : [p];
  });
}

/** Astro's route pattern for a file: `api/people/[id]/roles.ts` → `/api/people/[id]/roles`. */
function patternOf(file: string): string {
  const rel = path
    .relative(PAGES_DIR, file)
    .split(path.sep)
    .join('/')
    .replace(/\.(astro|ts|js|md|mdx|html)$/, '');
  const route = `/${rel}`.replace(/\/index$/, '');
  return route === '' ? '/' : route;
}

function exportedMethods(source: string): string[] {
  const found = HTTP_METHODS.filter((m) =>
    new RegExp(`export\\s+(const|let|async\\s+function|function)\\s+${m}\\b|export\\s*\\{[^}]*\\b${m}\\b`).test(source),
  );
  return /export\s+(const|async\s+function|function)\s+ALL\b/.test(source) ? [...HTTP_METHODS] : found;
}

function routeFiles(): RouteFile[] {
  return walk(PAGES_DIR)
    .filter((f) => /\.(astro|ts|js)$/.test(f) && !path.basename(f).startsWith('_'))
    .map((file) => {
      const pattern = patternOf(file);
      const api = !file.endsWith('.astro');
      return {
        file: path.relative(process.cwd(), file),
        pattern,
        api,
        methods: api ? exportedMethods(readFileSync(file, 'utf8')) : ['GET'],
      };
    })
    .sort((a, b) => a.pattern.localeCompare(b.pattern));
}

type Expect = 'a' | 's' | 'f';
const IDENTITIES: (Role | 'anonymous')[] = ['anonymous', 'designer', 'librarian', 'buyer', 'admin'];

/** `METHOD pattern` → expectations for anonymous, designer, librarian, buyer, admin. */
const MATRIX: Record<string, string> = {
  // Pages
  'GET /': 'saaaa',
  'GET /404': 'aaaaa',
  'GET /account': 'saaaa',
  'GET /account/no-access': 'saaaa',
  'GET /calculators': 'aaaaa',
  'GET /designs': 'saaaa',
  'GET /designs/[id]': 'saaaa',
  'GET /designs/[id]/compare': 'saaaa',
  'GET /designs/new': 'saffa',
  'GET /invite': 'aaaaa',
  'GET /mail': 'sfffa',
  'GET /parts': 'saaaa',
  'GET /parts/[id]': 'saaaa',
  'GET /parts/[id]/edit': 'saafa',
  'GET /parts/import': 'sfafa',
  'GET /parts/new': 'saafa',
  'GET /people': 'sfffa',
  'GET /quotes': 'sffaa',
  'GET /quotes/[id]': 'sffaa',
  'GET /rates': 'sfffa',
  'GET /reset': 'aaaaa',
  'GET /review': 'sfafa',
  'GET /shortlist': 'safaa',
  'GET /signin': 'aaaaa',
  // Accounts
  'POST /api/auth/invite-accept': 'aaaaa',
  'GET /api/auth/me': 'saaaa',
  'POST /api/auth/password': 'saaaa',
  'POST /api/auth/reset': 'aaaaa',
  'POST /api/auth/reset-request': 'aaaaa',
  'POST /api/auth/signin': 'aaaaa',
  'POST /api/auth/signout': 'aaaaa',
  'POST /api/auth/signout-everywhere': 'saaaa',
  'GET /api/people': 'sfffa',
  'POST /api/people': 'sfffa',
  'POST /api/people/[id]/deactivate': 'sfffa',
  'POST /api/people/[id]/invite': 'sfffa',
  'POST /api/people/[id]/reactivate': 'sfffa',
  'PUT /api/people/[id]/roles': 'sfffa',
  // Exchange rates: everyone signed in reads; only admins set them
  'GET /api/rates': 'saaaa',
  'PUT /api/rates': 'sfffa',
  // Open calculators and health
  'POST /api/calc/motor': 'aaaaa',
  'POST /api/calc/pull-resistor': 'aaaaa',
  'POST /api/calc/supply': 'aaaaa',
  'POST /api/calc/switch': 'aaaaa',
  'GET /api/health': 'aaaaa',
  // Designs: everyone signed in reads; designers write
  'GET /api/designs': 'saaaa',
  'POST /api/designs': 'saffa',
  'POST /api/designs/match': 'saaaa',
  'GET /api/designs/[id]': 'saaaa',
  'PUT /api/designs/[id]': 'saffa',
  'POST /api/designs/[id]/match': 'saaaa',
  'GET /api/designs/[id]/compare': 'saaaa',
  'POST /api/designs/[id]/status': 'saffa',
  'GET /api/designs/[id]/report.pdf': 'saaaa',
  'GET /api/designs/[id]/bom.csv': 'saaaa',
  // The shortlist's figures: the same people as the shortlist page
  'GET /api/shortlist': 'safaa',
  'GET /api/shortlist.csv': 'safaa',
  // Preferred source and note per shortlist option: buyers set them (designers only read them)
  'PUT /api/designs/[id]/preferences': 'sffaa',
  // Requests for quotation and supplier contacts: buyers (and admins) alone
  'GET /api/suppliers': 'sffaa',
  'POST /api/suppliers': 'sffaa',
  'PUT /api/suppliers/[id]': 'sffaa',
  'GET /api/quotes': 'sffaa',
  'POST /api/quotes': 'sffaa',
  'GET /api/quotes/[id]': 'sffaa',
  'POST /api/quotes/[id]/answer': 'sffaa',
  'POST /api/quotes/[id]/close': 'sffaa',
  // Change alerts: anyone signed in may acknowledge one (who and when are recorded)
  'POST /api/alerts/[id]/acknowledge': 'saaaa',
  // Catalogue: everyone signed in reads; designers propose; librarians curate; buyers keep supply data
  'GET /api/parts': 'saaaa',
  'POST /api/parts': 'saafa',
  'GET /api/parts.csv': 'saaaa',
  'GET /api/parts/[id]': 'saaaa',
  'PUT /api/parts/[id]': 'saafa',
  'DELETE /api/parts/[id]': 'sfafa',
  'POST /api/parts/[id]/datasheets': 'sfafa',
  'POST /api/parts/[id]/lifecycle': 'sfafa',
  'POST /api/parts/[id]/review': 'sfafa',
  'PUT /api/parts/[id]/sources': 'sfaaa',
  'GET /api/datasheets/[id]': 'saaaa',
  'DELETE /api/datasheets/[id]': 'sfafa',
  'POST /api/imports': 'sfafa',
  // Distributor offers: buyers and admins refresh the cache now
  'POST /api/distributor/refresh': 'sffaa',
};

const ROUTES = routeFiles();
const knex = appDb();
afterAll(() => knex.destroy());

/** A concrete path for a pattern: every parameter becomes an id no row has. */
function concrete(pattern: string): string {
  return pattern.replace(/\[\.\.\.[^\]]+\]/g, 'x').replace(/\[[^\]]+\]/g, '999999');
}

function asUser(identity: Role | 'anonymous'): SessionUser | null {
  return identity === 'anonymous' ? null : { id: 0, email: demoEmail(identity), name: identity, roles: [identity] };
}

async function ask(route: RouteFile, method: string, identity: Role | 'anonymous'): Promise<request.Response> {
  const url = appUrl();
  let req = request(url)[method.toLowerCase() as 'get'](concrete(route.pattern)).redirects(0);
  // A fresh session per request: some allowed calls (sign out everywhere) end the caller's sessions.
  if (identity !== 'anonymous') req = req.set('Cookie', await sessionCookie(knex, demoEmail(identity)));
  if (method !== 'GET') req = req.set('Content-Type', 'application/json').set('Origin', url).send('{}');
  return req;
}

function expectOutcome(res: request.Response, route: RouteFile, expected: Expect): void {
  const where = `${route.pattern} → ${res.status} ${res.text.slice(0, 200)}`;
  if (expected === 'a') {
    expect(res.status, where).toBeLessThan(500);
    expect([401, 403], where).not.toContain(res.status);
    if (!route.api) expect(res.headers.location ?? '', where).not.toMatch(/^\/signin/);
    return;
  }
  if (expected === 's' && route.api) {
    expect(res.status, where).toBe(401);
    expect(res.body, where).toEqual({ error: expect.any(String), issues: [] });
  } else if (expected === 's') {
    expect(res.status, where).toBe(302);
    expect(res.headers.location, where).toBe(`/signin?next=${encodeURIComponent(concrete(route.pattern))}`);
  } else if (route.api) {
    expect(res.status, where).toBe(403);
    expect(res.body, where).toEqual({ error: expect.any(String), issues: [] });
  } else {
    expect(res.status, where).toBe(403);
    expect(res.text, where).toContain('data-testid="no-access"');
  }
}

describe('the route list', () => {
  it('finds the pages and API routes', () => {
    expect(ROUTES.map((r) => r.pattern)).toEqual(
      expect.arrayContaining(['/', '/signin', '/people', '/api/health', '/api/auth/signin', '/api/people/[id]/roles']),
    );
  });

  it('has a hand-written row for every method of every route file, and no row without a route', () => {
    const served = ROUTES.flatMap((r) => r.methods.map((m) => `${m} ${r.pattern}`)).sort();
    expect(served).toEqual(Object.keys(MATRIX).sort());
  });
});

describe.each(IDENTITIES.map((id, i) => [id, i] as const))('as %s', (identity, column) => {
  const cases = ROUTES.flatMap((r) => r.methods.map((m) => [`${m} ${r.pattern}`, r, m] as const)).filter(([name]) => MATRIX[name]);
  it.each(cases)('%s', async (name, route, method) => {
    const res = await ask(route, method, identity);
    expectOutcome(res, route, MATRIX[name][column] as Expect);
  });
});

describe('deny by default', () => {
  it('refuses a route pattern and a method that have no rule', () => {
    const designer = asUser('designer');
    expect(decide('/no-rule-here', 'GET', null)).toBe('sign-in');
    expect(decide('/no-rule-here', 'GET', designer)).toBe('forbidden');
    expect(decide('/no-rule-here', 'GET', asUser('admin'))).toBe('forbidden');
    expect(decide('/api/auth/signin', 'GET', designer)).toBe('method-not-allowed');
  });

  it('lets admins use every route that names roles, and per-method rules differ by method', () => {
    const rules = { '/api/things/[id]': { GET: 'signed-in', PUT: ['librarian'], DELETE: ['librarian'] } } as const;
    expect(decide('/api/things/[id]', 'GET', asUser('buyer'), rules)).toBe('allow');
    expect(decide('/api/things/[id]', 'PUT', asUser('buyer'), rules)).toBe('forbidden');
    expect(decide('/api/things/[id]', 'PUT', asUser('librarian'), rules)).toBe('allow');
    expect(decide('/api/things/[id]', 'DELETE', asUser('admin'), rules)).toBe('allow');
    expect(decide('/api/things/[id]', 'POST', asUser('admin'), rules)).toBe('method-not-allowed');
  });

  it('answers an unknown page with the HTML not-found page, and an unknown API address with JSON', async () => {
    const page = await request(appUrl()).get('/no/such/page').redirects(0);
    expect(page.status).toBe(404);
    expect(page.headers['content-type']).toMatch(/text\/html/);
    expect(page.text).toContain('data-testid="not-found"');
    const api = await request(appUrl()).get('/api/no/such/route').redirects(0);
    expect(api.status).toBe(404);
    expect(api.headers['content-type']).toMatch(/application\/json/);
    expect(api.body).toEqual({ error: expect.any(String), issues: [] });
  });

  it('answers an unknown method with 405 and the allowed ones', async () => {
    const res = await request(appUrl()).get('/api/auth/signin');
    expect(res.status).toBe(405);
    expect(res.headers.allow).toBe('POST');
  });
});
