/**
 * Lists and loads the TypeScript migrations ourselves. knex's own loader uses a native import() that
 * cannot read .ts under vitest; an import() written here goes through whichever loader runs us
 * (tsx for the scripts, vite for the tests).
 */
import { readdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { Knex } from 'knex';

const DIR = path.join(path.dirname(fileURLToPath(import.meta.url)), 'migrations');

export class TsMigrationSource implements Knex.MigrationSource<string> {
  async getMigrations(): Promise<string[]> {
    return readdirSync(DIR)
      .filter((f) => /^\d{14}_.+\.ts$/.test(f))
      .sort();
  }

  getMigrationName(migration: string): string {
    return migration;
  }

  async getMigration(migration: string): Promise<Knex.Migration> {
    return (await import(pathToFileURL(path.join(DIR, migration)).href)) as Knex.Migration;
  }
}
