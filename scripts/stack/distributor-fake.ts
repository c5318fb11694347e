/**
 * A local fake distributor that `npm start` and `npm test` run on 127.0.0.1 in place of a hosted
 * distributor API. Its catalogue is its own: the invented distributor "Marlpit Components" carries most of
 * the demo parts under its own SKUs, with stock and price breaks that move over time, worked out from a
 * seed and the clock (the same seed and instant always give the same figures), so nothing is stored.
 *
 *   GET  /v1/offers?mpn=A&mpn=B   → {distributor, offers: [{mpn, sku, stock, moq, currency, leadTimeDays, priceBreaks}]}
 *   POST /control {mode, times?, delayMs?, retryAfter?}   switch how the next answers fail (tests)
 *   GET  /control/log             → {requests: [{at, path, mode, status}], pending, answered}  (at = ms since the
 *                                   epoch, logged on arrival; pending = offer requests held unanswered now (slow
 *                                   mode), answered = offer answers sent since the last reset)
 *   POST /control/reset           back to normal, log cleared
 *
 * Modes: normal; slow (waits delayMs before answering); 429 (with Retry-After: retryAfter, seconds or an
 * HTTP date); 500; 404 (a client error, not worth a retry); malformed (200 with a body that is not the agreed shape); partial (every third offer
 * broken). `times`: the mode lasts that many offer requests, then normal again (absent: until changed).
 */
import http from 'node:http';
import { demoParts } from '../../db/seeds/data/index.ts';

export const FAKE_DISTRIBUTOR_NAME = 'Marlpit Components';
export const FAKE_MODES = ['normal', 'slow', '429', '500', '404', 'malformed', 'partial'] as const;
export type FakeMode = (typeof FAKE_MODES)[number];

export interface FakeLogEntry {
  at: number;
  path: string;
  mode: FakeMode;
  status: number;
}

/** GET /control/log. */
export interface FakeLog {
  requests: FakeLogEntry[];
  pending: number;
  answered: number;
}

export interface FakeDistributor {
  url: string;
  close(): Promise<void>;
}

interface ModeState {
  mode: FakeMode;
  times: number | null;
  delayMs: number;
  retryAfter: string;
}

/** FNV-1a 32-bit: a small stable hash, enough to spread the invented figures. */
function hash(text: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h;
}

/** How long one set of figures holds: stock and prices step once per period. */
const PERIOD_MS = 10 * 60 * 1000;

export interface FakeOffer {
  mpn: string;
  sku: string;
  stock: number;
  moq: number;
  currency: string;
  leadTimeDays: number;
  priceBreaks: { qty: number; unitPrice: number }[];
}

/**
 * The fake's offer for a part number at an instant, or null when it does not carry the part (about one in
 * six). Deterministic in (seed, mpn, period of `nowMs`).
 */
export function fakeOffer(mpn: string, nowMs: number, seed = 'marlpit', motor = false): FakeOffer | null {
  const h = hash(`${seed}:${mpn}`);
  if (h % 6 === 0) return null;
  const period = Math.floor(nowMs / PERIOD_MS);
  const step = hash(`${seed}:${mpn}:${period}`);
  const baseStock = (h % 40) * 250;
  const stock = step % 7 === 0 ? 0 : baseStock + (step % 500);
  const basePrice = motor ? 8 + (h % 2000) / 100 : 0.08 + (h % 300) / 400;
  // The price drifts within ±5 % from one period to the next.
  const unit = basePrice * (1 + (((step >>> 8) % 101) - 50) / 1000);
  const round = (v: number): number => Math.round(v * 10_000) / 10_000;
  const currency = h % 3 === 0 ? 'USD' : 'EUR';
  return {
    mpn,
    sku: `MPC-${(h % 900_000) + 100_000}`,
    stock,
    moq: motor ? 1 : h % 2 === 0 ? 10 : 1,
    currency,
    leadTimeDays: stock === 0 ? 28 + (h % 5) * 7 : 2,
    priceBreaks: motor
      ? [
          { qty: 1, unitPrice: round(unit) },
          { qty: 10, unitPrice: round(unit * 0.92) },
        ]
      : [
          { qty: 1, unitPrice: round(unit) },
          { qty: 100, unitPrice: round(unit * 0.8) },
          { qty: 1000, unitPrice: round(unit * 0.62) },
        ],
  };
}

/** The demo parts it carries, with whether each is a motor (sold singly, priced higher). */
const CARRIED = new Map(demoParts.map((p) => [p.mpn, p.category === 'motor']));

function send(res: http.ServerResponse, status: number, body: unknown, headers: Record<string, string> = {}): void {
  const text = typeof body === 'string' ? body : JSON.stringify(body);
  res.writeHead(status, { 'Content-Type': 'application/json', ...headers });
  res.end(text);
}

function readBody(req: http.IncomingMessage): Promise<string> {
  return new Promise((resolve, reject) => {
    let text = '';
    req.setEncoding('utf8');
    req.on('data', (c: string) => {
      text += c;
      if (text.length > 10_000) req.destroy();
    });
    req.on('end', () => resolve(text));
    req.on('error', reject);
  });
}

/** Starts the fake on 127.0.0.1:`port` (0 = a free port). `clock` lets a test fix the instant. */
export async function startFakeDistributor(port = 0, options: { seed?: string; clock?: () => number } = {}): Promise<FakeDistributor> {
  const clock = options.clock ?? Date.now;
  let state: ModeState = { mode: 'normal', times: null, delayMs: 5_000, retryAfter: '1' };
  let log: FakeLogEntry[] = [];
  let answered = 0;
  const pending = new Set<NodeJS.Timeout>();

  function offers(url: URL): FakeOffer[] {
    const now = clock();
    return url.searchParams
      .getAll('mpn')
      .filter((m) => CARRIED.has(m))
      .map((m) => fakeOffer(m, now, options.seed, CARRIED.get(m)))
      .filter((o): o is FakeOffer => o !== null);
  }

  function answerOffers(url: URL, res: http.ServerResponse): void {
    const mode = state.mode;
    if (state.times !== null && --state.times <= 0) state = { ...state, mode: 'normal', times: null };
    const record = (status: number): void => {
      log.push({ at: clock(), path: url.pathname + url.search, mode, status });
      if (mode !== 'slow') answered++;
    };
    if (mode === '429') {
      record(429);
      return send(res, 429, { error: 'Too many requests' }, { 'Retry-After': state.retryAfter });
    }
    if (mode === '500') {
      record(500);
      return send(res, 500, { error: 'Internal error' });
    }
    if (mode === '404') {
      record(404);
      return send(res, 404, { error: 'No such catalogue' });
    }
    if (mode === 'malformed') {
      record(200);
      return send(res, 200, '{"distributor": "Marlpit Components", "offers": [{"mpn": ');
    }
    const list: unknown[] = offers(url);
    if (mode === 'partial') {
      for (let i = 0; i < list.length; i += 3) list[i] = { ...(list[i] as FakeOffer), stock: 'plenty', priceBreaks: 'call us' };
    }
    const body = { distributor: FAKE_DISTRIBUTOR_NAME, offers: list };
    if (mode === 'slow') {
      record(200);
      const t = setTimeout(() => {
        pending.delete(t);
        if (res.destroyed) return;
        answered++;
        send(res, 200, body);
      }, state.delayMs);
      pending.add(t);
      res.on('close', () => {
        clearTimeout(t);
        pending.delete(t);
      });
      return;
    }
    record(200);
    send(res, 200, body);
  }

  async function control(req: http.IncomingMessage, res: http.ServerResponse): Promise<void> {
    let input: Partial<{ mode: string; times: number; delayMs: number; retryAfter: string | number }>;
    try {
      input = JSON.parse((await readBody(req)) || '{}');
    } catch {
      return send(res, 400, { error: 'body is not JSON' });
    }
    if (!FAKE_MODES.includes(input.mode as FakeMode)) return send(res, 400, { error: `mode is one of ${FAKE_MODES.join(', ')}` });
    state = {
      mode: input.mode as FakeMode,
      times: typeof input.times === 'number' && input.times > 0 ? input.times : null,
      delayMs: typeof input.delayMs === 'number' ? input.delayMs : 5_000,
      retryAfter: input.retryAfter === undefined ? '1' : String(input.retryAfter),
    };
    send(res, 200, { mode: state.mode, times: state.times });
  }

  const server = http.createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://127.0.0.1');
    if (req.method === 'GET' && url.pathname === '/v1/offers') return answerOffers(url, res);
    if (req.method === 'POST' && url.pathname === '/control') return void control(req, res);
    if (req.method === 'GET' && url.pathname === '/control/log') return send(res, 200, { requests: log, pending: pending.size, answered });
    if (req.method === 'POST' && url.pathname === '/control/reset') {
      state = { mode: 'normal', times: null, delayMs: 5_000, retryAfter: '1' };
      log = [];
      answered = 0;
      return send(res, 200, { mode: 'normal' });
    }
    send(res, 404, { error: 'not found' });
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', (err: NodeJS.ErrnoException) =>
      reject(
        new Error(
          err.code === 'EADDRINUSE'
            ? `port ${port} for the fake distributor is in use: set DISTRIBUTOR_FAKE_PORT to a free one`
            : err.message,
        ),
      ),
    );
    server.listen(port, '127.0.0.1', () => resolve());
  });
  const address = server.address();
  const actual = typeof address === 'object' && address ? address.port : port;
  return {
    url: `http://127.0.0.1:${actual}`,
    async close() {
      for (const t of pending) clearTimeout(t);
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}
