/**
 * App server faults under a running `npm start` (issue 11, items 6 and 8): the app server process killed
 * with SIGKILL is started again by the supervisor; SIGTERM to `npm start` while slow requests run (a
 * 5,000-row import commit, an upload sent slowly in pieces) stops new connections, lets both finish with
 * their full answers, and ends with exit code 0 (README "Running and faults").
 */
import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  blockedOn,
  commitImport,
  DIODE_MAKER,
  diodeCsv,
  holdPartKey,
  signIn,
  startSupervisedStack,
  waitHealthy,
  type SupervisedStack,
} from './supervised-stack.ts';

let stack: SupervisedStack;
let librarian = '';
beforeAll(async () => {
  // The import below waits on a held row lock while SIGTERM is delivered and checked; a statement
  // deadline of 30 s (instead of the default 5 s) keeps that wait from timing out on a slow machine.
  // Nothing in this file tests the deadline itself (database.test.ts does).
  stack = await startSupervisedStack({ DB_QUERY_TIMEOUT_MS: '30000' });
  librarian = await signIn(stack.url, 'librarian');
});
afterAll(async () => {
  await stack?.cleanup();
});

/**
 * POSTs `csv` for preview without a Content-Length (chunked) in `pieces` parts. The request asks for
 * `100 Continue`, which Node's server sends when it hands the request to the app, so `taken` resolves
 * once the server is provably handling it; the first part goes then, the others `gapMs` apart after
 * `goOn` resolves.
 */
function slowPreview(url: string, cookie: string, csv: string, pieces: number, gapMs: number, goOn: Promise<void>) {
  const { hostname, port } = new URL(url);
  let taken!: () => void;
  const takenP = new Promise<void>((r) => (taken = r));
  const answer = new Promise<{ status: number; body: string }>((resolve, reject) => {
    const req = http.request(
      {
        host: hostname,
        port,
        method: 'POST',
        path: '/api/imports?mode=preview',
        headers: { Cookie: cookie, 'Content-Type': 'text/csv', Expect: '100-continue' },
      },
      (res) => {
        let body = '';
        res.on('data', (c) => (body += c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body }));
      },
    );
    req.on('error', reject);
    const size = Math.ceil(csv.length / pieces);
    let i = 0;
    const next = (): void => {
      req.write(csv.slice(i * size, (i + 1) * size));
      i += 1;
      if (i < pieces) setTimeout(next, gapMs);
      else req.end();
    };
    req.once('continue', () => {
      req.write(csv.slice(0, size));
      i = 1;
      taken();
      void goOn.then(() => setTimeout(next, gapMs));
    });
    req.flushHeaders();
  });
  return { taken: takenP, answer };
}

const connects = (url: string): Promise<boolean> =>
  fetch(`${url}/api/health`).then(
    () => true,
    () => false,
  );

describe('the app server process killed with SIGKILL', () => {
  it('is started again by the supervisor and serves, with the same MariaDB', async () => {
    const pid = stack.appPid();
    const dbPid = stack.mariadbPid();
    const logFrom = stack.output().length;
    process.kill(pid, 'SIGKILL');
    await stack.waitForLog(/app server restarted \(pid (\d+)\)/, 30_000, logFrom);
    expect(stack.output().slice(logFrom)).toMatch(new RegExp(`app server \\(pid ${pid}\\) crashed \\(killed by SIGKILL\\)`));
    expect(stack.appPid()).not.toBe(pid);
    await waitHealthy(stack.url, 10_000);
    // Sessions live in MariaDB: the librarian is still signed in on the new process.
    expect((await fetch(`${stack.url}/api/auth/me`, { headers: { Cookie: librarian } })).status).toBe(200);
    expect(stack.mariadbPid()).toBe(dbPid);
  });
});

describe('SIGTERM to npm start during slow requests', () => {
  it('refuses new connections, finishes the import and the slow upload with full answers, exits 0', async () => {
    const logFrom = stack.output().length;
    // Row 2,500 is held by an uncommitted insert of the test: the import waits there, half written,
    // until the hold is released after SIGTERM.
    const hold = await holdPartKey(stack, { category: 'diode', manufacturer: DIODE_MAKER, mpn: 'TERM-02500' });
    let importing: Promise<Response>;
    let uploading: ReturnType<typeof slowPreview>;
    try {
      let rowsModified: number;
      ({ answer: importing, rowsModified } = await blockedOn(hold, () =>
        commitImport(stack.url, librarian, diodeCsv('TERM', 5_000), 'faults-term-1'),
      ));
      // The 2,499 parts before the held row at least (their parameters and audit rows come on top).
      expect(rowsModified).toBeGreaterThanOrEqual(2_499);
      let goOn!: () => void;
      uploading = slowPreview(stack.url, librarian, diodeCsv('SLOW', 40), 6, 500, new Promise((r) => (goOn = r)));
      uploading.answer.catch(() => {}); // awaited below
      await uploading.taken;

      stack.proc.kill('SIGTERM');
      await stack.waitForLog(/app server: SIGTERM; finishing requests in flight/, 10_000, logFrom);
      expect(await connects(stack.url)).toBe(false);
      // Both requests are still open: the upload has sent one piece of six, the import waits on row 2,500.
      const still = await Promise.race([importing.then(() => 'answered'), new Promise((r) => setTimeout(() => r('open'), 50))]);
      expect(still).toBe('open');
      goOn();
      await hold.release();
    } finally {
      hold.close();
    }

    const imported = await importing;
    const report = (await imported.json()) as { counts: { created: number }; rows: { mpn: string; outcome: string }[] };
    expect(imported.status).toBe(201);
    expect(report.counts.created).toBe(5_000);
    expect(report.rows.find((r) => r.mpn === 'TERM-02500')?.outcome).toBe('created');
    const preview = await uploading.answer;
    expect(preview.status, preview.body.slice(0, 300)).toBe(200);
    expect(JSON.parse(preview.body).counts).toMatchObject({ rows: 40, ready: 40, invalid: 0 });

    expect(await stack.exited).toEqual({ code: 0, signal: null });
    const log = stack.output().slice(logFrom);
    expect(log).toContain('app server: every request finished; stopped');
    expect(log).toContain('stopped cleanly');
    expect(log).not.toMatch(/crashed|restarting/);
  });
});
