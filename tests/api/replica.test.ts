/**
 * The read replica: a second private MariaDB on loopback following the suite's database with MariaDB's
 * own replication (scripts/stack/replica.ts: binary log with GTIDs on the primary, a dump carrying the
 * GTID position, CHANGE MASTER TO … MASTER_USE_GTID=slave_pos, START SLAVE), and a second app server of
 * the built app with DB_REPLICA_HOST/DB_REPLICA_PORT naming it. Checked beside the app, on the replica
 * itself: a part written through the app arrives there (polled, with a bound); the replica refuses the
 * app user's writes (read_only); search reads are answered from the replica (a word put into one part's
 * description on the replica only is found through the replicated app and not through the suite's own
 * app, which reads the primary); with the replica stopped, search and the catalogue page still answer
 * 200, now from the primary.
 */
import path from 'node:path';
import type { ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import knexFactory, { type Knex } from 'knex';
import { knexConfig } from '../../knexfile.ts';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';
import { adminPing, describeInstance, rootSql, stopMariaDb, type MariaDbInstance } from '../../scripts/stack/mariadb.ts';
import { replicaStatus, startReplica } from '../../scripts/stack/replica.ts';
import { spawnAppServer, stopAppServer } from '../../scripts/stack/app-process.ts';
import { freePort } from '../../scripts/stack/throwaway.ts';

const knex = appDb();
let replica: MariaDbInstance | null = null;
let replicaKnex: Knex | null = null;
let child: ChildProcess | null = null;
let url = '';
let created: { id: number; mpn: string } | null = null;
/** An invented word put into one description on the replica only. */
const REPLICA_ONLY_WORD = 'quillwortzed';

async function pollUntil<T>(what: string, probe: () => Promise<T | undefined>, boundMs = 15_000): Promise<T> {
  const deadline = Date.now() + boundMs;
  for (;;) {
    const got = await probe();
    if (got !== undefined) return got;
    if (Date.now() > deadline) throw new Error(`${what}: not seen within ${boundMs} ms`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

function search(base: string, q: string, cookie: string) {
  return request(base).get('/api/parts').query({ q, pageSize: 50 }).set('Cookie', cookie);
}

beforeAll(async () => {
  const primary = describeInstance(process.env.MARIADB_DATADIR!, Number(process.env.MARIADB_PORT));
  const port = await freePort();
  replica = await startReplica({
    primary,
    dataDir: path.join(process.env.DATA_DIR!, 'replica-mariadb'),
    port,
    database: process.env.DB_NAME!,
    user: process.env.DB_USER!,
    password: process.env.DB_PASSWORD!,
  });
  replicaKnex = knexFactory(knexConfig({ ...process.env, DB_PORT: String(port) }));
  const env = {
    ...process.env,
    HOST: '127.0.0.1',
    PORT: String(await freePort()),
    DB_REPLICA_HOST: '127.0.0.1',
    DB_REPLICA_PORT: String(port),
  };
  url = (await spawnAppServer(process.cwd(), env, (c) => (child = c))).url;
}, 120_000);

afterAll(async () => {
  if (child) await stopAppServer(child, 5_000);
  await replicaKnex?.destroy();
  if (replica) await stopMariaDb(replica);
  await knex.destroy();
});

describe('read replica', () => {
  it('follows the primary: both replication threads run', () => {
    expect(replicaStatus(replica!)).toMatchObject({ ioRunning: 'Yes', sqlRunning: 'Yes' });
  });

  it("a part written through the app is readable on the replica (polled, 15 s bound), and the replica refuses the app user's writes", async () => {
    const mpn = `ORS77-45-RPL-${Date.now().toString(36).toUpperCase()}`;
    const res = await request(url)
      .post('/api/parts')
      .set('Cookie', await sessionCookie('librarian'))
      .set('Content-Type', 'application/json')
      .send(
        JSON.stringify({
          category: 'diode',
          manufacturer: 'Ostler Rectifier Works',
          mpn,
          description: 'Replica test Schottky diode, 45 V (invented)',
          package: 'SMB',
          params: { kind: 'schottky', vrrmV: 45, ifAvA: 2, ifsmA: 50, vfV: 0.55, vfAtIfA: 2, trrNs: null },
          sources: [],
        }),
      );
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    created = { id: res.body.id, mpn };
    // Written to the primary (the app writes there only) …
    expect(await knex('parts').where({ id: created.id }).first('mpn')).toEqual({ mpn });
    // … and replicated.
    const row = await pollUntil(
      'the new part on the replica',
      async () => (await replicaKnex!('parts').where({ id: created!.id }).first('mpn', 'description')) ?? undefined,
    );
    expect(row).toEqual({ mpn, description: 'Replica test Schottky diode, 45 V (invented)' });
    await expect(replicaKnex!('parts').where({ id: created.id }).update({ description: 'changed on the replica' })).rejects.toMatchObject({
      code: 'ER_OPTION_PREVENTS_STATEMENT',
    });
  });

  it('search reads are answered from the replica', async () => {
    expect(created).not.toBeNull();
    // Root on the replica may write despite read_only; the primary never sees this change.
    rootSql(
      replica!,
      `UPDATE \`${process.env.DB_NAME}\`.parts SET description = CONCAT(description, ' ${REPLICA_ONLY_WORD}') WHERE id = ${created!.id};`,
    );
    const designer = await sessionCookie('designer');
    const viaReplica = await search(url, REPLICA_ONLY_WORD, designer);
    expect(viaReplica.status).toBe(200);
    expect(viaReplica.body.items.map((p: { id: number }) => p.id)).toContain(created!.id);
    const viaPrimary = await search(appUrl(), REPLICA_ONLY_WORD, designer);
    expect(viaPrimary.status).toBe(200);
    expect(viaPrimary.body.items.map((p: { id: number }) => p.id)).not.toContain(created!.id);
  });

  it('with the replica stopped, search and the catalogue page still answer 200, from the primary', async () => {
    await stopMariaDb(replica!);
    expect(adminPing(replica!)).toBe(false);
    const designer = await sessionCookie('designer');
    const word = await search(url, REPLICA_ONLY_WORD, designer);
    expect(word.status, JSON.stringify(word.body)).toBe(200);
    // The word was only ever on the replica: not finding it shows the answer came from the primary.
    expect(word.body.items.map((p: { id: number }) => p.id)).not.toContain(created!.id);
    const byMpn = await search(url, created!.mpn, designer);
    expect(byMpn.status).toBe(200);
    expect(byMpn.body.items[0]?.id).toBe(created!.id);
    const home = await request(url).get('/').set('Cookie', designer);
    expect(home.status).toBe(200);
    expect(home.text).toContain('data-testid="catalogue-total"');
    expect((await request(url).get('/api/health')).status).toBe(200);
  });
});
