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

/** Runs single migrations up (or down) until `name` has just run (or just been undone). */
async function stepUntil(direction: 'up' | 'down', name: string): Promise<void> {
  for (let i = 0; i < 200; i++) {
    const [, log] = (await db.migrate[direction]()) as [number, string[]];
    if (log.length === 0) throw new Error(`ran out of migrations before ${name}`);
    if (log.includes(name)) return;
  }
  throw new Error(`${name} never ran`);
}

describe('migrations', () => {
  it('go up, all the way down, and up again', async () => {
    await db.migrate.latest();
    const first = await tables();
    expect(first).toEqual(
      expect.arrayContaining([
        'parts',
        'mosfet_params',
        'mosfet_rds_on_points',
        'driver_params',
        'diode_params',
        'motor_params',
        'part_sources',
        'part_price_breaks',
        'datasheets',
        'audit_events',
        'users',
      ]),
    );
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

  it('convert each old driver input_default to input_pull honestly, and back on the way down', async () => {
    // The old column said what the OUTPUT did with the input open. Written out by hand from
    // docs/engineering.md §9.3 (output with an open input = input level, inverted when the driver inverts):
    // the input is pulled to the level that gives that output; floating means no pull. No value was ever
    // recorded, so input_pull_ohms stays empty.
    const table: { inputDefault: 'low' | 'high' | 'floating'; inverting: boolean; inputPull: 'up' | 'down' | 'none' }[] = [
      { inputDefault: 'low', inverting: false, inputPull: 'down' },
      { inputDefault: 'low', inverting: true, inputPull: 'up' },
      { inputDefault: 'high', inverting: false, inputPull: 'up' },
      { inputDefault: 'high', inverting: true, inputPull: 'down' },
      { inputDefault: 'floating', inverting: false, inputPull: 'none' },
      { inputDefault: 'floating', inverting: true, inputPull: 'none' },
    ];
    await db.migrate.rollback(undefined, true);
    await stepUntil('up', '20261202030200_create_design_parts.ts'); // the schema just before the input-pull migrations
    const mpn = (i: number) => `MIGTEST-${i}`;
    for (const [i, row] of table.entries()) {
      const [id] = await db('parts').insert({
        category: 'driver',
        manufacturer: 'Invented Migration Drives',
        mpn: mpn(i),
        description: 'migration test row',
      });
      await db('driver_params').insert({
        part_id: id,
        kind: 'gate-driver',
        channels: 1,
        inverting: row.inverting,
        supply_min_v: 4.5,
        supply_max_v: 18,
        input_logic: 'fixed',
        input_high_min: 2,
        input_low_max: 0.8,
        output_high_drop_v: 0.1,
        output_low_max_v: 0.1,
        source_current_a: 1,
        sink_current_a: 1,
        propagation_delay_ns: 50,
        input_default: row.inputDefault,
      });
    }
    const read = (cols: string[]) =>
      db('driver_params')
        .join('parts', 'parts.id', 'driver_params.part_id')
        .where('parts.manufacturer', 'Invented Migration Drives')
        .orderBy('parts.mpn')
        .select(['parts.mpn', ...cols.map((c) => `driver_params.${c}`)]);
    const expectedUp = table.map((r, i) => ({ mpn: mpn(i), input_pull: r.inputPull, input_pull_ohms: null }));

    await db.migrate.latest();
    expect(await read(['input_pull', 'input_pull_ohms'])).toEqual(expectedUp);
    const columns = Object.keys(await db('driver_params').columnInfo());
    expect(columns).not.toContain('input_default');

    await stepUntil('down', '20261202040000_add_driver_params_input_pull.ts');
    expect(await read(['input_default'])).toEqual(table.map((r, i) => ({ mpn: mpn(i), input_default: r.inputDefault })));
    expect(Object.keys(await db('driver_params').columnInfo())).not.toContain('input_pull');

    await db.migrate.latest();
    expect(await read(['input_pull', 'input_pull_ohms'])).toEqual(expectedUp);
    await db('parts').where('manufacturer', 'Invented Migration Drives').delete();
  });
});
