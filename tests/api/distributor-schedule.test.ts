/**
 * The scheduled distributor refresh as two app servers run it (two schedules on one database, as
 * scripts/stack/serve.ts starts one per server), against a fake distributor of this file's own that
 * answers each request after 300 ms. The lock in MariaDB must keep the refreshes one at a time: the
 * refresh asks its batches one after another, so with a single refresher the fake's request log (its own
 * timestamps) never shows two requests closer together than the fake's delay. After stop() no server asks
 * again.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appDb } from '../helpers/stack.ts';
import { startFakeDistributor, type FakeDistributor, type FakeLogEntry } from '../../scripts/stack/distributor-fake.ts';
import { startDistributorSchedule } from '../../src/server/distributor/schedule.ts';
import { readConfig } from '../../src/server/config.ts';
import { refreshState } from '../../src/server/repos/distributor-offers.ts';

const knex = appDb();
const DELAY_MS = 300;
let fake: FakeDistributor;

async function requestLog(): Promise<FakeLogEntry[]> {
  return ((await (await fetch(`${fake.url}/control/log`)).json()) as { requests: FakeLogEntry[] }).requests;
}
const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

beforeAll(async () => {
  fake = await startFakeDistributor(0);
  await fetch(`${fake.url}/control`, { method: 'POST', body: JSON.stringify({ mode: 'slow', delayMs: DELAY_MS }) });
});
afterAll(async () => {
  await fake.close();
  await knex.destroy();
  // The schedules used the app's own pool (src/server/db.ts); close it as the server's shutdown does.
  const shutdown = (globalThis as Record<symbol, unknown>)[Symbol.for('stallpoint.shutdown')];
  if (typeof shutdown === 'function') await (shutdown as () => Promise<void>)();
});

describe('scheduled refresh on two app servers', () => {
  it('refreshes on its interval, one server at a time, and stops when asked', async () => {
    const config = readConfig({ ...process.env, DISTRIBUTOR_URL: fake.url });
    const parts = new Set((await knex('parts').where({ review_status: 'approved' }).pluck('mpn')) as string[]).size;
    const batches = Math.ceil(parts / 50);
    const servers = [startDistributorSchedule(config, 100), startDistributorSchedule(config, 100)];
    // Wait for at least two full refreshes' worth of requests.
    for (let i = 0; i < 400 && (await requestLog()).length < 2 * batches; i++) await pause(25);
    await Promise.all(servers.map((s) => s.stop()));
    const log = await requestLog();
    expect(log.length).toBeGreaterThanOrEqual(2 * batches);
    for (let i = 1; i < log.length; i++)
      expect(log[i].at - log[i - 1].at, `requests ${i - 1} and ${i}`).toBeGreaterThanOrEqual(DELAY_MS - 5);
    const state = await refreshState(knex);
    expect(state.holder).toBeNull();
    expect(state.lastOk).toBe(true);
    // Stopped: nothing more reaches the distributor.
    await pause(400);
    expect(await requestLog()).toHaveLength(log.length);
  }, 60_000);

  it('does not start at all when the interval is 0 (the default under test)', async () => {
    const before = (await requestLog()).length;
    const s = startDistributorSchedule(
      readConfig({ ...process.env, NODE_ENV: 'test', DISTRIBUTOR_REFRESH_MIN: '', DISTRIBUTOR_URL: fake.url }),
    );
    await pause(300);
    await s.stop();
    expect(await requestLog()).toHaveLength(before);
  });
});
