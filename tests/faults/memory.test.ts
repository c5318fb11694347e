/**
 * Memory of the app server under hostile uploads (issue 11, item 9), read from the process itself
 * (/proc/<pid>/status, VmRSS) under a running `npm start`: a PDF bomb is inspected in a worker with a
 * budget, and a JSON body without a Content-Length is cut at its cap while it streams, so neither may
 * leave the server's resident memory more than 100 MB above where it was (the bound the issue sets).
 * Before the fixes these cost +2.4 GB (a 64 KiB bomb) and +600 MB kept (300 MB to sign-in).
 */
import { readFileSync } from 'node:fs';
import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { numberBomb, spaceBomb } from '../helpers/pdf-bombs.ts';
import { signIn, startSupervisedStack, type SupervisedStack } from './supervised-stack.ts';

const MB = 1024 * 1024;
/** The bound of issue 11, item 9. */
const RSS_BOUND_BYTES = 100 * MB;

let stack: SupervisedStack;
let librarian = '';
let partId = 0;
beforeAll(async () => {
  stack = await startSupervisedStack();
  librarian = await signIn(stack.url, 'librarian');
  partId = (await stack.knex()('parts').where({ mpn: 'CWN30L02-S3' }).first('id')).id;
});
afterAll(async () => {
  await stack?.cleanup();
});

/** Resident memory of a process in bytes, as the kernel counts it (VmRSS in /proc/<pid>/status, kB). */
function rssBytes(pid: number): number {
  const m = readFileSync(`/proc/${pid}/status`, 'utf8').match(/^VmRSS:\s+(\d+) kB$/m);
  if (!m) throw new Error(`no VmRSS for process ${pid}`);
  return Number(m[1]) * 1024;
}

/** Samples the RSS of `pid` every 20 ms while `work` runs; the highest value seen. */
async function peakRssDuring<T>(pid: number, work: () => Promise<T>): Promise<{ value: T; peak: number }> {
  let peak = rssBytes(pid);
  const timer = setInterval(() => (peak = Math.max(peak, rssBytes(pid))), 20);
  try {
    const value = await work();
    return { value, peak: Math.max(peak, rssBytes(pid)) };
  } finally {
    clearInterval(timer);
  }
}

async function uploadPdf(bytes: Buffer, filename: string): Promise<{ status: number; body: { issues?: { path: string }[] } }> {
  const form = new FormData();
  form.append('file', new Blob([new Uint8Array(bytes)], { type: 'application/pdf' }), filename);
  const res = await fetch(`${stack.url}/api/parts/${partId}/datasheets`, {
    method: 'POST',
    headers: { Cookie: librarian, Origin: stack.url },
    body: form,
  });
  return { status: res.status, body: (await res.json()) as { issues?: { path: string }[] } };
}

/**
 * Streams `totalBytes` of a JSON body (one long string value) to sign-in, chunked, without a
 * Content-Length, and stops sending once the answer is there; the status and how much was sent by then.
 */
function chunkedSignIn(totalBytes: number): Promise<{ status: number; body: string; sentBytes: number }> {
  const { hostname, port } = new URL(stack.url);
  return new Promise((resolve, reject) => {
    let sent = 0;
    let answered = false;
    const req = http.request({
      host: hostname,
      port,
      method: 'POST',
      path: '/api/auth/signin',
      headers: { 'Content-Type': 'application/json', 'Transfer-Encoding': 'chunked' },
    });
    req.on('response', (res) => {
      answered = true;
      let body = '';
      res.on('data', (c) => (body += c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body, sentBytes: sent }));
      res.on('error', reject);
    });
    req.on('error', (err: NodeJS.ErrnoException) => {
      // The server may close the connection once it has answered; the answer is what counts.
      if (!(answered && (err.code === 'EPIPE' || err.code === 'ECONNRESET'))) reject(err);
    });
    const chunk = Buffer.alloc(MB, 0x61); // "aaaa…" inside the string value
    req.write('{"email":"');
    const pump = (): void => {
      while (!answered && sent < totalBytes) {
        sent += chunk.length;
        if (!req.write(chunk)) return void req.once('drain', pump);
      }
      if (!answered) req.end('","password":"x"}');
    };
    pump();
  });
}

describe('app server memory under hostile uploads', () => {
  it('PDF bombs (64 MB of unpacked spaces; 12 million numbers) answer 413 and leave the RSS within 100 MB', async () => {
    const pid = stack.appPid();
    // A normal request first, so that the route's code is loaded before the baseline is taken.
    expect((await uploadPdf(Buffer.from('not a pdf'), 'warm-up.pdf')).status).toBe(415);
    const before = rssBytes(pid);
    for (const [bomb, name] of [
      [spaceBomb(), 'space-bomb.pdf'],
      [numberBomb(), 'number-bomb.pdf'],
    ] as const) {
      const res = await uploadPdf(bomb, name);
      expect(res.status, JSON.stringify(res.body)).toBe(413);
      expect(res.body.issues?.[0].path).toBe('file');
    }
    const after = rssBytes(pid);
    expect(after - before, `RSS before ${(before / MB).toFixed(0)} MB, after ${(after / MB).toFixed(0)} MB`).toBeLessThan(RSS_BOUND_BYTES);
    expect(stack.appPid(), 'the same app server process').toBe(pid);
    expect((await fetch(`${stack.url}/api/health`)).status).toBe(200);
  });

  it('a 300 MB chunked JSON body to sign-in answers 413 and the RSS stays within 100 MB, while it streams and after', async () => {
    const pid = stack.appPid();
    const before = rssBytes(pid);
    const { value: res, peak } = await peakRssDuring(pid, () => chunkedSignIn(300 * MB));
    expect(res.status, res.body.slice(0, 300)).toBe(413);
    expect(JSON.parse(res.body)).toMatchObject({ error: expect.any(String), issues: [{ path: '(body)' }] });
    const after = rssBytes(pid);
    const figures = `RSS before ${(before / MB).toFixed(0)} MB, peak ${(peak / MB).toFixed(0)} MB, after ${(after / MB).toFixed(0)} MB, sent ${(res.sentBytes / MB).toFixed(0)} MB`;
    expect(peak - before, figures).toBeLessThan(RSS_BOUND_BYTES);
    expect(after - before, figures).toBeLessThan(RSS_BOUND_BYTES);
    expect(stack.appPid(), 'the same app server process').toBe(pid);
  });
});
