/**
 * Test isolation: right after migrate + seed, the test script copies every table of the app database
 * into a snapshot database; each API and browser test file starts by copying it back (tests/helpers/
 * isolate-file.ts), so no file sees what another left behind and the order of files cannot matter.
 */
import type { Knex } from 'knex';

async function tablesOf(knex: Knex, schema: string): Promise<string[]> {
  const [rows] = (await knex.raw(
    'SELECT TABLE_NAME AS t FROM information_schema.TABLES WHERE TABLE_SCHEMA = ? AND TABLE_TYPE = ? ORDER BY TABLE_NAME',
    [schema, 'BASE TABLE'],
  )) as [{ t: string }[]];
  return rows.map((r) => r.t);
}

const q = (name: string): string => {
  if (!/^[A-Za-z0-9_]+$/.test(name)) throw new Error(`unexpected identifier ${name}`);
  return `\`${name}\``;
};

/** The stored columns of a table, quoted: generated columns (parts.mpn_norm) are worked out by the copy itself. */
async function storedColumns(knex: Knex, schema: string, table: string): Promise<string> {
  const [rows] = (await knex.raw(
    "SELECT COLUMN_NAME AS c FROM information_schema.COLUMNS WHERE TABLE_SCHEMA = ? AND TABLE_NAME = ? AND IS_GENERATED = 'NEVER' ORDER BY ORDINAL_POSITION",
    [schema, table],
  )) as [{ c: string }[]];
  return rows.map((r) => q(r.c)).join(', ');
}

/** Copies every table of `from` into `to` (structure and rows), replacing what `to` held. */
export async function snapshotDatabase(knex: Knex, from: string, to: string): Promise<void> {
  await knex.transaction(async (trx) => {
    await trx.raw('SET FOREIGN_KEY_CHECKS = 0');
    for (const t of await tablesOf(trx, to)) await trx.raw(`DROP TABLE ${q(to)}.${q(t)}`);
    for (const t of await tablesOf(trx, from)) {
      await trx.raw(`CREATE TABLE ${q(to)}.${q(t)} LIKE ${q(from)}.${q(t)}`);
      const cols = await storedColumns(trx, from, t);
      await trx.raw(`INSERT INTO ${q(to)}.${q(t)} (${cols}) SELECT ${cols} FROM ${q(from)}.${q(t)}`);
    }
    await trx.raw('SET FOREIGN_KEY_CHECKS = 1');
  });
}

/**
 * Puts `to` back to the snapshot `from`: every table emptied and refilled, auto-increment counters
 * included. One connection with foreign-key checks off for the copy.
 */
export async function restoreDatabase(knex: Knex, from: string, to: string): Promise<void> {
  const conn = await knex.client.acquireConnection();
  const run = (sql: string): Promise<unknown> =>
    new Promise((resolve, reject) => conn.query(sql, (err: Error | null, res: unknown) => (err ? reject(err) : resolve(res))));
  try {
    await run('SET FOREIGN_KEY_CHECKS = 0');
    for (const t of await tablesOf(knex, from)) {
      await run(`TRUNCATE TABLE ${q(to)}.${q(t)}`);
      const cols = await storedColumns(knex, from, t);
      await run(`INSERT INTO ${q(to)}.${q(t)} (${cols}) SELECT ${cols} FROM ${q(from)}.${q(t)}`);
    }
  } finally {
    await run('SET FOREIGN_KEY_CHECKS = 1').catch(() => undefined);
    await knex.client.releaseConnection(conn);
  }
}
