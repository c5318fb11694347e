import type { Knex } from 'knex';

/**
 * The catalogue's version, for the match's in-memory candidates (src/server/services/candidate-cache.ts).
 * Every insert, update and delete of a row the match reads (parts, their parameters, RDS(on) and Zth
 * points, sources and price breaks) sets one slot of catalogue_version to a fresh UUID_SHORT(), in the
 * writing transaction, by trigger — so every write path (the app, imports, seeds, a librarian's SQL)
 * counts. Slots are keyed by CONNECTION_ID() % 64, so concurrent writers rarely wait on one row.
 * UUID_SHORT() never repeats on a server, so the set of (slot, token) pairs read in a snapshot differs
 * from any earlier one once any write has committed.
 *
 * With binary logging on, CREATE TRIGGER needs SUPER or log_bin_trust_function_creators (the private
 * MariaDB sets it). Where neither is granted the triggers are left out and the app reads the candidates
 * from the database on every match, as before (the cache checks that all 24 triggers exist: repos/catalogue-version.ts).
 */
const CATALOGUE_TRIGGER_TABLES = [
  'parts',
  'mosfet_params',
  'mosfet_rds_on_points',
  'mosfet_zth_points',
  'driver_params',
  'diode_params',
  'part_sources',
  'part_price_breaks',
] as const;
const EVENTS = { ins: 'INSERT', upd: 'UPDATE', del: 'DELETE' } as const;
const CATALOGUE_SLOTS = 64;

const triggerNames = () =>
  CATALOGUE_TRIGGER_TABLES.flatMap((table) =>
    Object.entries(EVENTS).map(([short, event]) => ({ name: `catver_${table}_${short}`, table, event })),
  );

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('catalogue_version', (t) => {
    t.comment('Tokens changed by trigger on every write to what the match reads (in-memory candidates)');
    t.tinyint('slot').unsigned().primary().comment('CONNECTION_ID() % 64 of the writer');
    t.bigInteger('token').unsigned().notNullable().comment('UUID_SHORT() of the last write from this slot');
  });
  await knex.raw(
    `INSERT INTO catalogue_version (slot, token) VALUES ${Array.from({ length: CATALOGUE_SLOTS }, (_, i) => `(${i}, UUID_SHORT())`).join(', ')}`,
  );
  try {
    for (const { name, table, event } of triggerNames()) {
      await knex.raw(
        `CREATE TRIGGER ${name} AFTER ${event} ON ${table} FOR EACH ROW ` +
          `INSERT INTO catalogue_version (slot, token) VALUES (CONNECTION_ID() % ${CATALOGUE_SLOTS}, UUID_SHORT()) ` +
          'ON DUPLICATE KEY UPDATE token = VALUES(token)',
      );
    }
  } catch (err) {
    // 1419: binary logging on and neither SUPER nor log_bin_trust_function_creators.
    if ((err as { errno?: number }).errno !== 1419) throw err;
    for (const { name } of triggerNames()) await knex.raw(`DROP TRIGGER IF EXISTS ${name}`);
    console.warn(
      'catalogue_version: triggers not created (binary logging needs SUPER or log_bin_trust_function_creators); matches read the catalogue from the database each time.',
    );
  }
}

export async function down(knex: Knex): Promise<void> {
  for (const { name } of triggerNames()) await knex.raw(`DROP TRIGGER IF EXISTS ${name}`);
  await knex.schema.dropTableIfExists('catalogue_version');
}
