import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appUrl, startDatabase, stopDatabase } from '../helpers/stack.ts';

// The app's own db module, loaded in this test process with a main pool of one connection, so a single
// open transaction exhausts it. This shows the health check has a connection of its own without timing
// anything: on the main pool the ping could not get a connection and would answer false. The pool size
// is set inside the test, not at load, so the suite's own setup keeps its usual pool.
afterAll(async () => {
  const shutdown = (globalThis as Record<symbol, unknown>)[Symbol.for('stallpoint.shutdown')];
  if (typeof shutdown === 'function') await (shutdown as () => Promise<void>)();
});

describe('health check connection', () => {
  it('pings the database while every connection of the main pool is held', async () => {
    process.env.DB_POOL_MAX = '1';
    const appDbModule = await import('../../src/server/db.ts');
    const main = appDbModule.db();
    const trx = await main.transaction();
    try {
      await trx.raw('select 1');
      const pool = main.client.pool as { max: number; numUsed(): number; numFree(): number };
      expect(pool.max).toBe(1);
      expect(pool.numUsed()).toBe(1);
      expect(pool.numFree()).toBe(0);
      expect(await appDbModule.pingDb()).toBe(true);
    } finally {
      await trx.rollback();
    }
  });
});

describe('GET /api/health', () => {
  it('answers 200 {db:"ok"} with the database up', async () => {
    const res = await request(appUrl()).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ db: 'ok' });
    expect(res.headers['x-content-type-options']).toBe('nosniff');
  });

  it('answers 503 with the database stopped, and recovers when it is back', async () => {
    await stopDatabase();
    try {
      const down = await request(appUrl()).get('/api/health');
      expect(down.status).toBe(503);
      expect(down.body.db).not.toBe('ok');
    } finally {
      await startDatabase();
    }
    let status = 0;
    for (let i = 0; i < 50 && status !== 200; i++) {
      status = (await request(appUrl()).get('/api/health')).status;
      if (status !== 200) await new Promise((r) => setTimeout(r, 200));
    }
    expect(status).toBe(200);
  });
});
