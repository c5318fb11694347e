import { defineMiddleware } from 'astro:middleware';
import type { APIContext } from 'astro';
import { securityHeaders } from './server/http/security-headers.ts';
import { appConfig } from './server/config.ts';
import { jsonError } from './server/http/responses.ts';
import { errorResponse } from './server/http/error-response.ts';
import { db } from './server/db.ts';
import { sessionFromCookies } from './server/auth/request-session.ts';
import { accessFor, allowedMethods, decide, isApiRoute, type Decision } from './server/auth/policy.ts';

/**
 * Every request: the session cookie → locals.user / locals.session (null when absent), the route's rule
 * from src/server/auth/policy.ts (deny by default), the route, errors mapped to responses in one place
 * (src/server/http/error-response.ts), then security headers on the response.
 * OWASP ASVS 5.0 V8.3.1 (access enforced at a trusted service layer), V3.4 (security headers).
 */
export const onRequest = defineMiddleware(async (context, next) => {
  const response = await guarded(context, next);
  for (const [name, value] of Object.entries(securityHeaders(appConfig().publicUrl))) {
    if (!response.headers.has(name)) response.headers.set(name, value);
  }
  if (context.locals.user && !response.headers.has('Cache-Control')) response.headers.set('Cache-Control', 'private, no-store');
  return response;
});

async function guarded(context: APIContext, next: () => Promise<Response>): Promise<Response> {
  context.locals.user = null;
  context.locals.session = null;
  try {
    Object.assign(context.locals, await sessionFromCookies(db(), context.cookies, context.url));
  } catch (err) {
    // The database is down: public routes (health check, calculators, sign-in) still go on and answer
    // for themselves; the rest say so here (503 with Retry-After, src/server/http/error-response.ts).
    if (accessFor(context.routePattern, context.request.method) !== 'public') return errorResponse(err, isApiRoute(context.routePattern));
  }
  // No route matched: Astro renders the 404 page, but an API address answers in the API's own shape.
  if (context.routePattern === '/404' && context.url.pathname.startsWith('/api/')) return jsonError(404, 'No API route at this address.');
  const decision = decide(context.routePattern, context.request.method, context.locals.user);
  if (decision !== 'allow') return refuse(context, decision);
  try {
    return await next();
  } catch (err) {
    // The one error path: every refusal a route or service throws, and every bug, in the one shape.
    return errorResponse(err, isApiRoute(context.routePattern));
  }
}

function refuse(context: APIContext, decision: Exclude<Decision, 'allow'>): Response | Promise<Response> {
  const api = isApiRoute(context.routePattern);
  if (decision === 'method-not-allowed') {
    return jsonError(405, `This address does not take ${context.request.method}.`, [], {
      Allow: allowedMethods(context.routePattern).join(', '),
    });
  }
  if (decision === 'sign-in') {
    if (api) return jsonError(401, 'Sign in first.');
    const next = context.url.pathname + context.url.search;
    return context.redirect(`/signin?next=${encodeURIComponent(next)}`, 302);
  }
  if (api) return jsonError(403, 'Your role does not allow this.');
  return forbiddenPage(context);
}

/** The page's address stays; the no-access page is shown with 403. */
async function forbiddenPage(context: APIContext): Promise<Response> {
  const page = await context.rewrite('/account/no-access');
  return new Response(page.body, { status: 403, statusText: 'Forbidden', headers: page.headers });
}
