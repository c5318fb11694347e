/**
 * The role matrix, generated from the route files under src/pages: every page and API route, every
 * method it exports, asked as anonymous, designer, librarian, buyer and admin, must answer as
 * src/server/auth/policy.ts says. A route file without a rule fails here.
 * OWASP ASVS 5.0 V8.1.1 (access rules documented in one place), V8.2.1 (function-level access),
 * V8.3.1 (enforced on the server, deny by default).
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appDb, appUrl } from '../helpers/stack.ts';
import { accessFor, decide, ROUTE_RULES, type Decision } from '../../src/server/auth/policy.ts';
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
  const rel = path.relative(PAGES_DIR, file).split(path.sep).join('/').replace(/\.(astro|ts|js|md|mdx|html)$/, '');
  const route = `/${rel}`.replace(/\/index$/, '');
  return route === '' ? '/' : route;
}

function exportedMethods(source: string): string[] {
  const found = HTTP_METHODS.filter((m) => new RegExp(`export\\s+(const|let|async\\s+function|function)\\s+${m}\\b|export\\s*\\{[^}]*\\b${m}\\b`).test(source));
  return /export\s+(const|async\s+function|function)\s+ALL\b/.test(source) ? [...HTTP_METHODS] : found;
}

function routeFiles(): RouteFile[] {
  return walk(PAGES_DIR)
    .filter((f) => /\.(astro|ts|js)$/.test(f) && !path.basename(f).startsWith('_'))
    .map((file) => {
      const pattern = patternOf(file);
      const api = !file.endsWith('.astro');
      return { file: path.relative(process.cwd(), file), pattern, api, methods: api ? exportedMethods(readFileSync(file, 'utf8')) : ['GET'] };
    })
    .sort((a, b) => a.pattern.localeCompare(b.pattern));
}

const IDENTITIES: (Role | 'anonymous')[] = ['anonymous', 'designer', 'librarian', 'buyer', 'admin'];
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

function expectDecision(res: request.Response, route: RouteFile, decision: Decision): void {
  const where = `${route.pattern} → ${res.status}`;
  if (decision === 'allow') {
    expect([401, 403], where).not.toContain(res.status);
    if (!route.api) expect(res.headers.location ?? '', where).not.toMatch(/^\/signin/);
    return;
  }
  if (decision === 'sign-in' && route.api) {
    expect(res.status, where).toBe(401);
    expect(res.body, where).toEqual({ error: expect.any(String), issues: [] });
  } else if (decision === 'sign-in') {
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
    expect(ROUTES.map((r) => r.pattern)).toEqual(expect.arrayContaining(['/', '/signin', '/people', '/api/health', '/api/auth/signin', '/api/people/[id]/roles']));
  });

  it.each(ROUTES.map((r) => [r.pattern, r] as const))('%s has a rule for every method it serves', (_p, route) => {
    expect(ROUTE_RULES[route.pattern], `${route.file} has no rule in src/server/auth/policy.ts`).toBeDefined();
    expect(route.methods.length, `${route.file} exports no HTTP method`).toBeGreaterThan(0);
    for (const m of route.methods) expect(accessFor(route.pattern, m), `${route.file}: no rule for ${m}`).toBeDefined();
  });
});

describe.each(IDENTITIES)('as %s', (identity) => {
  const cases = ROUTES.filter((r) => ROUTE_RULES[r.pattern] !== undefined).flatMap((r) => r.methods.map((m) => [`${m} ${r.pattern}`, r, m] as const));
  it.each(cases)('%s answers as the policy says', async (_name, route, method) => {
    const res = await ask(route, method, identity);
    expectDecision(res, route, decide(route.pattern, method, asUser(identity)));
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

  it('answers an unknown method with 405 and the allowed ones', async () => {
    const res = await request(appUrl()).get('/api/auth/signin');
    expect(res.status).toBe(405);
    expect(res.headers.allow).toBe('POST');
  });
});
