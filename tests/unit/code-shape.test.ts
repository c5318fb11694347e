/**
 * The code's shape as DEVELOPERS.md describes it, read from the source files: API routes parse, call a
 * service and answer (no error handling of their own: the middleware maps every error); services hold no
 * SQL and no HTTP objects (SQL lives in src/server/repos); the engineering core in src/lib imports nothing
 * from the server. A file that breaks a rule is named with the line.
 */
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const root = path.resolve(import.meta.dirname, '../..');

function filesUnder(dir: string, ext: RegExp): string[] {
  return readdirSync(path.join(root, dir), { recursive: true, withFileTypes: true })
    .filter((d) => d.isFile() && ext.test(d.name))
    .map((d) => path.relative(root, path.join(d.parentPath, d.name)));
}

function offenders(files: string[], rules: [RegExp, string][]): string[] {
  const found: string[] = [];
  for (const file of files) {
    readFileSync(path.join(root, file), 'utf8')
      .split('\n')
      .forEach((line, i) => {
        for (const [re, what] of rules) if (re.test(line)) found.push(`${file}:${i + 1} ${what}: ${line.trim()}`);
      });
  }
  return found;
}

describe('code shape', () => {
  it('API routes handle no errors themselves', () => {
    const routes = filesUnder('src/pages/api', /\.ts$/);
    expect(routes.length).toBeGreaterThan(30);
    expect(
      offenders(routes, [
        [/\btry\s*\{/, 'try block'],
        [/\bcatch\s*[({]/, 'catch'],
        [/instanceof Response/, 'instanceof Response'],
      ]),
    ).toEqual([]);
  });

  it('services hold no SQL and build no HTTP objects', () => {
    const services = filesUnder('src/server/services', /\.ts$/);
    expect(services.length).toBeGreaterThan(20);
    expect(
      offenders(services, [
        [/\b(db\(\)|trx|knex|tx)\(\s*['"`]/, 'query builder on a table'],
        [/\.raw\(/, 'raw SQL'],
        [/new Response\(|Response\.json\(|Response\.redirect\(/, 'HTTP response'],
        [/from 'astro'/, 'astro import'],
      ]),
    ).toEqual([]);
  });

  it('the engineering core imports nothing from the server', () => {
    const lib = filesUnder('src/lib', /\.ts$/);
    expect(lib.length).toBeGreaterThan(20);
    expect(offenders(lib, [[/from '(\.\.\/)+server\//, 'server import']])).toEqual([]);
  });

  it('numbers are formatted by src/lib/units.ts only', () => {
    const sources = [...filesUnder('src', /\.(ts|tsx|astro)$/).filter((f) => f !== path.join('src', 'lib', 'units.ts'))];
    expect(sources.length).toBeGreaterThan(100);
    expect(offenders(sources, [[/\.to(Fixed|Precision)\(/, 'hand formatting']])).toEqual([]);
  });
});
