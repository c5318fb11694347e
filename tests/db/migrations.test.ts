import { afterAll, describe, expect, it } from 'vitest';
import { scratchDb } from '../helpers/stack.ts';

const db = scratchDb();
afterAll(() => db.destroy());

async function tables(): Promise<string[]> {
  const rows: { t: string }[] = await db
    .select(db.raw('table_name as t'))
    .from('information_schema.tables')
    .where('table_schema', process.env.DB_SCRATCH_NAME!)
    .whereNot('table_name', 'like', 'knex_migrations%');
  return rows.map((r) => r.t).sort();
}

describe('migrations', () => {
  it('go up, all the way down, and up again', async () => {
    await db.migrate.latest();
    const first = await tables();
    expect(first).toEqual(expect.arrayContaining(['parts', 'mosfet_params', 'mosfet_rds_on_points', 'driver_params',
      'diode_params', 'motor_params', 'part_sources', 'part_price_breaks', 'datasheets', 'audit_events', 'users']));
    await db.migrate.rollback(undefined, true);
    expect(await tables()).toEqual([]);
    await db.migrate.latest();
    expect(await tables()).toEqual(first);
  });

  it('puts a comment on every column', async () => {
    await db.migrate.latest();
    const missing = await db('information_schema.columns')
      .select('table_name', 'column_name')
      .where('table_schema', process.env.DB_SCRATCH_NAME!)
      .whereNot('table_name', 'like', 'knex_migrations%')
      .where((q) => q.whereNull('column_comment').orWhere('column_comment', ''));
    expect(missing).toEqual([]);
  });
});
