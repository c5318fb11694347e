/**
 * Graceful stop of the HTTP server (scripts/stack/graceful.ts) on a plain node:http server: a request in
 * flight when the stop begins gets its whole answer, a new connection is refused, and a request that
 * outlasts the grace is cut when the grace ends.
 */
import http from 'node:http';
import net from 'node:net';
import { afterEach, describe, expect, it } from 'vitest';
import { closeWhenClosing, gracefulClose } from '../../scripts/stack/graceful.ts';

let server: http.Server | null = null;
afterEach(() => {
  server?.closeAllConnections();
  server?.close();
  server = null;
});

async function serveSlow(delayMs: number): Promise<{ port: number; begin: () => void }> {
  server = http.createServer((_req, res) => setTimeout(() => res.end('done'), delayMs));
  const closing = closeWhenClosing(server);
  await new Promise<void>((r) => server!.listen(0, '127.0.0.1', () => r()));
  return { port: (server.address() as net.AddressInfo).port, begin: closing.begin };
}

function get(port: number): Promise<{ status: number; body: string; connection: string | undefined }> {
  return new Promise((resolve, reject) => {
    http
      .get({ host: '127.0.0.1', port, path: '/', agent: new http.Agent({ keepAlive: true }) }, (res) => {
        let body = '';
        res.on('data', (c) => (body += c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body, connection: res.headers.connection }));
      })
      .on('error', reject);
  });
}

describe('gracefulClose', () => {
  it('lets a request in flight finish, refuses new connections, and reports that nothing was cut', async () => {
    const { port, begin } = await serveSlow(600);
    const inFlight = get(port);
    await new Promise((r) => setTimeout(r, 100));
    const stopped = gracefulClose(server!, 5_000, begin);
    await new Promise((r) => setTimeout(r, 50));
    await expect(get(port)).rejects.toMatchObject({ code: 'ECONNREFUSED' });
    const answer = await inFlight;
    expect(answer.status).toBe(200);
    expect(answer.body).toBe('done');
    expect(answer.connection).toBe('close');
    expect(await stopped).toBe(true);
  });

  it('cuts a request that outlasts the grace once the grace is over', async () => {
    const { port, begin } = await serveSlow(10_000);
    const inFlight = get(port).then(
      () => 'answered',
      () => 'cut',
    );
    await new Promise((r) => setTimeout(r, 100));
    const t0 = Date.now();
    expect(await gracefulClose(server!, 300, begin)).toBe(false);
    expect(Date.now() - t0).toBeGreaterThanOrEqual(290);
    expect(Date.now() - t0).toBeLessThan(3_000);
    expect(await inFlight).toBe('cut');
  });
});
