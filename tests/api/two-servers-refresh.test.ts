/**
 * The scheduled distributor refresh with two real app server processes (tests/helpers/app-processes.ts:
 * scripts/stack/app-server.ts forked twice, each on its own port, on the suite's database), both
 * running the schedule every 3 s against one fake distributor of this file's own that answers each
 * request after 300 ms. Expectations (issue 13, README "Distributor offers"):
 * - from the fake's request log: the refreshes come one at a time (no two requests closer together than
 *   the fake's delay, as one refresher asks its batches one after another), each round asks for every
 *   approved part number exactly once, and rounds start at least 0.9 intervals apart (one round per
 *   interval, not one per server);
 * - from the lock row: killed with SIGKILL while it holds the lock, a process leaves the lock behind; the
 *   other process takes it over only once it has expired (DISTRIBUTOR_LOCK_S = 6 s here), and finishes a
 *   full round.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appDb } from '../helpers/stack.ts';
import { startAppProcesses, stopAll, type AppProcess } from '../helpers/app-processes.ts';
import { startFakeDistributor, type FakeDistributor, type FakeLogEntry } from '../../scripts/stack/distributor-fake.ts';

const knex = appDb();
const DELAY_MS = 300;
const INTERVAL_S = 3;
const LOCK_S = 6;
const BATCH = 50; // part numbers per request (README "Distributor offers")
let fake: FakeDistributor;
let procs: AppProcess[] = [];
let mpns: string[] = [];

const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));
async function requestLog(): Promise<FakeLogEntry[]> {
  return ((await (await fetch(`${fake.url}/control/log`)).json()) as { requests: FakeLogEntry[] }).requests;
}
const mpnsOf = (e: FakeLogEntry): string[] => new URL(e.path, 'http://x').searchParams.getAll('mpn');

/** Splits the log into rounds: a round ends when a part number comes again. */
function rounds(log: FakeLogEntry[]): FakeLogEntry[][] {
  const out: FakeLogEntry[][] = [];
  let seen = new Set<string>();
  for (const e of log) {
    const asked = mpnsOf(e);
    if (out.length === 0 || asked.some((m) => seen.has(m))) {
      out.push([]);
      seen = new Set();
    }
    out[out.length - 1].push(e);
    for (const m of asked) seen.add(m);
  }
  return out;
}
const sorted = (r: FakeLogEntry[]) => r.flatMap(mpnsOf).sort();

async function lockRow(): Promise<{ holder: string | null; lockedUntil: Date | null; startedAt: Date | null; leftMs: number | null }> {
  const [rows] = await knex.raw(
    `SELECT holder, locked_until, last_started_at, TIMESTAMPDIFF(MICROSECOND, NOW(3), locked_until) AS left_us
       FROM distributor_refresh WHERE job = 'offers'`,
  );
  const r = rows[0];
  return {
    holder: r.holder,
    lockedUntil: r.locked_until,
    startedAt: r.last_started_at,
    leftMs: r.left_us === null ? null : Number(r.left_us) / 1000,
  };
}
const pidOf = (holder: string): number => Number(holder.split(':')[1]);

beforeAll(async () => {
  mpns = [...new Set((await knex('parts').where({ review_status: 'approved' }).pluck('mpn')) as string[])].sort();
  fake = await startFakeDistributor(0);
  await fetch(`${fake.url}/control`, { method: 'POST', body: JSON.stringify({ mode: 'slow', delayMs: DELAY_MS }) });
  procs = await startAppProcesses(2, {
    DISTRIBUTOR_URL: fake.url,
    DISTRIBUTOR_REFRESH_MIN: String(INTERVAL_S / 60),
    DISTRIBUTOR_LOCK_S: String(LOCK_S),
    DISTRIBUTOR_TIMEOUT_MS: '5000',
  });
}, 120_000);
afterAll(async () => {
  await stopAll(procs);
  await fake?.close();
  await knex.destroy();
});

describe('the scheduled refresh on two app server processes', () => {
  it('asks for each offer once per interval, one process at a time', async () => {
    const batches = Math.ceil(mpns.length / BATCH);
    // A round must fit well inside the interval and the lock for this test to mean anything.
    expect(batches * DELAY_MS).toBeLessThan(0.9 * INTERVAL_S * 1000 - 500);
    const holders = new Set<number>();
    // Four complete rounds (the first two servers' first ticks come within a few seconds of each other).
    for (let i = 0; i < 300 && rounds(await requestLog()).length < 5; i++) {
      const { holder } = await lockRow();
      if (holder) holders.add(pidOf(holder));
      await pause(100);
    }
    const all = rounds(await requestLog()).slice(0, 4);
    expect(all).toHaveLength(4);
    const log = all.flat();
    for (let i = 1; i < log.length; i++)
      expect(log[i].at - log[i - 1].at, `requests ${i - 1} and ${i}`).toBeGreaterThanOrEqual(DELAY_MS - 5);
    for (const [i, r] of all.entries()) {
      expect(sorted(r), `round ${i}: every approved part number once`).toEqual(mpns);
      expect(r).toHaveLength(batches);
    }
    for (let i = 1; i < all.length; i++)
      expect(all[i][0].at - all[i - 1][0].at, `rounds ${i - 1} and ${i} start apart`).toBeGreaterThanOrEqual(0.9 * INTERVAL_S * 1000 - 20);
    // The lock was held by the processes started here, nobody else.
    for (const pid of holders) expect(procs.map((p) => p.pid)).toContain(pid);
    console.log(`rounds start ${all.map((r) => r[0].at - all[0][0].at).join(', ')} ms; lock holders seen: ${[...holders].join(', ')}`);
  }, 90_000);

  it('moves on to the other process once the lock of a killed holder expires', async () => {
    // Slower answers so that a round is surely in flight when its holder is killed.
    await fetch(`${fake.url}/control`, { method: 'POST', body: JSON.stringify({ mode: 'slow', delayMs: 1_000 }) });
    let held = await lockRow();
    for (let i = 0; i < 200 && !(held.holder && (held.leftMs ?? 0) > 1_000); i++) {
      await pause(50);
      held = await lockRow();
    }
    expect(held.holder, 'a process took the lock').not.toBeNull();
    const victim = procs.find((p) => p.pid === pidOf(held.holder!))!;
    const survivor = procs.find((p) => p !== victim)!;
    expect(victim).toBeDefined();
    process.kill(victim.pid, 'SIGKILL');
    const killedAt = Date.now();
    await victim.exited;
    const logAtKill = (await requestLog()).length;

    // The dead holder's lock stays until it expires; then the survivor takes it and does a full round.
    let next = await lockRow();
    for (let i = 0; i < 400 && !(next.holder && next.holder !== held.holder); i++) {
      await pause(50);
      next = await lockRow();
    }
    expect(next.holder, 'the other process took the lock').not.toBeNull();
    expect(pidOf(next.holder!)).toBe(survivor.pid);
    expect(next.startedAt!.getTime()).toBeGreaterThanOrEqual(held.lockedUntil!.getTime());
    // The survivor holds the lock now; its first request follows once it has read the parts.
    let takeover = (await requestLog()).slice(logAtKill);
    for (let i = 0; i < 100 && takeover.length === 0; i++) {
      await pause(50);
      takeover = (await requestLog()).slice(logAtKill);
    }
    expect(takeover.length).toBeGreaterThan(0);
    // Nothing asked the distributor between the kill and the expiry of the dead holder's lock.
    expect(takeover[0].at - killedAt).toBeGreaterThanOrEqual(held.leftMs! - 100);
    console.log(
      `killed pid ${victim.pid} with ${Math.round(held.leftMs!)} ms of its lock left; pid ${survivor.pid} asked again ${takeover[0].at - killedAt} ms after the kill`,
    );
    await fetch(`${fake.url}/control`, { method: 'POST', body: JSON.stringify({ mode: 'slow', delayMs: DELAY_MS }) });
    for (let i = 0; i < 200; i++) {
      const row = (await knex('distributor_refresh').where({ job: 'offers' }).first()) as { holder: string | null; last_ok: number | null };
      if (row.holder === null) break;
      await pause(100);
    }
    const round = rounds((await requestLog()).slice(logAtKill))[0];
    expect(sorted(round), "the survivor's round asked for every approved part number once").toEqual(mpns);
    const state = await knex('distributor_refresh').where({ job: 'offers' }).first();
    expect(state.holder).toBeNull();
    expect(Boolean(state.last_ok)).toBe(true);
  }, 90_000);
});
