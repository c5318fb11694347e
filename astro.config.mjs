// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwindcss from '@tailwindcss/vite';
import { CSP_DIRECTIVES } from './src/server/http/security-headers.ts';

/** @returns {{ hostname: string, protocol?: string }[]} */
function allowedDomains() {
  const hosts = [{ hostname: '127.0.0.1' }, { hostname: 'localhost' }];
  if (process.env.PUBLIC_URL) hosts.push({ hostname: new URL(process.env.PUBLIC_URL).hostname });
  return hosts;
}

// Server-rendered app; @astrojs/node in middleware mode so our own http.Server (scripts/stack/serve.ts)
// owns listening, static files and graceful shutdown.
export default defineConfig({
  output: 'server',
  adapter: node({ mode: 'middleware' }),
  integrations: [react()],
  server: { host: '127.0.0.1', port: 4321 },
  // allowedDomains: the Host names Astro believes when it builds request URLs (and so the origin that
  // checkOrigin compares form posts against, and the base of e-mailed links in local mode). Without it
  // every request looks like http://localhost. PUBLIC_URL's host is added when set at build time.
  security: { checkOrigin: true, allowedDomains: allowedDomains() },
  // Astro hashes the inline scripts and styles it emits (island bootstrap) into the CSP header of every
  // page, so no 'unsafe-inline' is needed; the other directives come from the one security-headers module.
  experimental: { csp: { directives: [...CSP_DIRECTIVES] } },
  vite: {
    plugins: [tailwindcss()],
    ssr: { external: ['@node-rs/argon2', 'mysql2', 'knex', 'nodemailer', 'smtp-server', 'mailparser'] },
  },
});
