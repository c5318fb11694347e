/**
 * Our own http.Server in front of Astro's middleware-mode handler: static files from dist/client,
 * security headers, and a graceful close (in-flight requests finish within a grace, then the app's knex
 * pool closes). `npm start` runs it in a supervised child process (app-server.ts); `npm test` in-process.
 * Each server also runs the scheduled distributor refresh (src/server/distributor/schedule.ts; off under
 * test unless DISTRIBUTOR_REFRESH_MIN is set), the sweep of unsent change alerts (src/server/alert-sweep.ts;
 * off under test unless ALERT_SWEEP_S is set) and the outbox runs (src/server/outbox/schedule.ts; off under
 * test unless OUTBOX_INTERVAL_S is set), all stopped before the pool closes.
 */
import http from 'node:http';
import v8 from 'node:v8';
import { createReadStream, existsSync, statSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { securityHeaders } from '../../src/server/http/security-headers.ts';
import { readConfig } from '../../src/server/config.ts';
import { closeWhenClosing, gracefulClose } from './graceful.ts';
import { startDistributorSchedule } from '../../src/server/distributor/schedule.ts';
import { startAlertSweep } from '../../src/server/alert-sweep.ts';
import { startOutboxSchedule } from '../../src/server/outbox/schedule.ts';
import { warmCandidates } from '../../src/server/services/candidate-cache.ts';

const TYPES: Record<string, string> = {
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.woff': 'font/woff',
  '.woff2': 'font/woff2',
  '.ttf': 'font/ttf',
  '.txt': 'text/plain; charset=utf-8',
  '.json': 'application/json',
};

type Handler = (req: http.IncomingMessage, res: http.ServerResponse, next?: (err?: unknown) => void) => void;

function staticFile(clientDir: string, urlPath: string): string | null {
  let decoded: string;
  try {
    decoded = decodeURIComponent(urlPath);
  } catch {
    return null;
  }
  const file = path.normalize(path.join(clientDir, decoded));
  if (!file.startsWith(clientDir + path.sep)) return null;
  if (!existsSync(file) || !statSync(file).isFile()) return null;
  return file;
}

/**
 * Astro takes the client address from X-Forwarded-For when present. Unless a trusted proxy sits in
 * front (TRUST_PROXY=1), drop those headers so nobody can pick their own address and slip past the
 * per-address sign-in limit (OWASP ASVS 5.0 V6.3.1).
 */
function dropUntrustedForwarding(req: http.IncomingMessage, trustProxy: boolean): void {
  if (trustProxy) return;
  for (const h of ['x-forwarded-for', 'x-forwarded-host', 'x-forwarded-proto', 'x-forwarded-port']) delete req.headers[h];
}

/**
 * Bounds how far the heap grows between full collections (HEAP_GROWTH_PERCENT). V8 reads the factor at
 * every collection, so setting it once the process runs takes effect from the next one. Measured at 67,000
 * parts: matches one after another peaked at 955 MiB of RSS with V8's own factor, 465 MiB at 50 %.
 */
function boundHeapGrowth(percent: number): void {
  if (percent > 0) v8.setFlagsFromString(`--heap-growing-percent=${percent}`);
}

export async function createListener(distDir: string): Promise<http.RequestListener> {
  const entry = pathToFileURL(path.join(distDir, 'server', 'entry.mjs')).href;
  const { handler } = (await import(entry)) as { handler: Handler };
  const clientDir = path.join(distDir, 'client');
  const { trustProxy, publicUrl, heapGrowthPercent } = readConfig(process.env);
  boundHeapGrowth(heapGrowthPercent);
  const headers = securityHeaders(publicUrl);
  return (req, res) => {
    dropUntrustedForwarding(req, trustProxy);
    const urlPath = (req.url ?? '/').split('?')[0];
    const file = req.method === 'GET' || req.method === 'HEAD' ? staticFile(clientDir, urlPath) : null;
    if (file) {
      for (const [k, v] of Object.entries(headers)) res.setHeader(k, v);
      res.setHeader('Content-Type', TYPES[path.extname(file)] ?? 'application/octet-stream');
      res.setHeader('Cache-Control', urlPath.startsWith('/_astro/') ? 'public, max-age=31536000, immutable' : 'public, max-age=3600');
      if (req.method === 'HEAD') return void res.end();
      createReadStream(file).pipe(res);
      return;
    }
    const answerJson = (err: unknown): void => {
      if (!res.headersSent) {
        res.writeHead(err ? 500 : 404, { 'Content-Type': 'application/json', ...headers });
      }
      res.end(JSON.stringify({ error: err ? 'Something went wrong on the server.' : 'Not found.', issues: [] }));
    };
    handler(req, res, (err) => {
      // No route matched: pages get the not-found page (rendered by Astro with status 404), the API JSON.
      if (err || urlPath.startsWith('/api/') || urlPath === '/404' || res.headersSent || (req.method !== 'GET' && req.method !== 'HEAD')) {
        answerJson(err);
        return;
      }
      req.url = '/404';
      handler(req, res, answerJson);
    });
  };
}

export interface RunningServer {
  server: http.Server;
  url: string;
  /** Stops accepting, lets requests in flight finish for up to `graceMs`, closes the pool; false when some were cut. */
  close(graceMs?: number): Promise<boolean>;
}

export async function startHttpServer(distDir: string, host: string, port: number): Promise<RunningServer> {
  const server = http.createServer(await createListener(distDir));
  server.keepAliveTimeout = 5_000;
  const closing = closeWhenClosing(server);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve());
  });
  const address = server.address();
  const actualPort = typeof address === 'object' && address ? address.port : port;
  const schedule = startDistributorSchedule(readConfig(process.env));
  const sweep = startAlertSweep(readConfig(process.env));
  const outbox = startOutboxSchedule(readConfig(process.env));
  // The match's in-memory candidates, read in the background so the first match does not wait for them.
  warmCandidates();
  return {
    server,
    url: `http://${host}:${actualPort}`,
    async close(graceMs = readConfig(process.env).shutdownGraceS * 1000) {
      const allFinished = await gracefulClose(server, graceMs, closing.begin);
      await Promise.all([schedule.stop(), sweep.stop(), outbox.stop()]);
      const shutdown = (globalThis as Record<symbol, unknown>)[Symbol.for('stallpoint.shutdown')];
      if (typeof shutdown === 'function') await (shutdown as () => Promise<void>)();
      return allFinished;
    },
  };
}
