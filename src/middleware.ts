import { defineMiddleware } from 'astro:middleware';
import { SECURITY_HEADERS } from './server/http/security-headers.ts';

/** Sets locals.user / locals.session (null when absent) and adds security headers to every response. */
export const onRequest = defineMiddleware(async (context, next) => {
  context.locals.user = null;
  context.locals.session = null;
  const response = await next();
  for (const [name, value] of Object.entries(SECURITY_HEADERS)) {
    if (!response.headers.has(name)) response.headers.set(name, value);
  }
  return response;
});
