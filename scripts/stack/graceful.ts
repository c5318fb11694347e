/**
 * Graceful stop of an http.Server: no new connections, idle keep-alive connections closed at once,
 * requests in flight (slow uploads and imports included) run on; after `graceMs` whatever is still
 * open is cut. Responses written while closing carry `Connection: close`, so keep-alive clients do not
 * send another request on a connection that is about to go.
 */
import type http from 'node:http';

export function closeWhenClosing(server: http.Server): { closing: () => boolean; begin: () => void } {
  let closing = false;
  const open = new Set<http.ServerResponse>();
  const markClose = (res: http.ServerResponse): void => {
    if (!res.headersSent) res.setHeader('Connection', 'close');
  };
  server.prependListener('request', (_req: http.IncomingMessage, res: http.ServerResponse) => {
    if (closing) return markClose(res);
    open.add(res);
    res.once('close', () => open.delete(res));
  });
  return {
    closing: () => closing,
    begin: () => {
      closing = true;
      for (const res of open) markClose(res);
    },
  };
}

/** Resolves `true` when every request finished within the grace, `false` when some were cut. */
export async function gracefulClose(server: http.Server, graceMs: number, begin: () => void = () => {}): Promise<boolean> {
  begin();
  let cut = false;
  const closed = new Promise<void>((resolve) => server.close(() => resolve()));
  server.closeIdleConnections();
  // Connections that go idle after their last response (keep-alive) are closed as they do.
  const sweep = setInterval(() => server.closeIdleConnections(), 250);
  const force = setTimeout(() => {
    cut = true;
    server.closeAllConnections();
  }, graceMs);
  try {
    await closed;
  } finally {
    clearInterval(sweep);
    clearTimeout(force);
  }
  return !cut;
}
