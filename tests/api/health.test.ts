import { describe, expect, it } from 'vitest';
import request from 'supertest';
import { appUrl, startDatabase, stopDatabase } from '../helpers/stack.ts';

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
