/**
 * Every check id the engines emit has a readable name in the one table (src/lib/design-words.ts
 * CHECK_LABELS), collected two ways: from the engines' source (every `id: '…'` / `const id = '…'` in the
 * files that build checks) and from the engines' outputs for every demo design against the demo catalogue.
 */
import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { demoDiodes, demoDrivers, demoMosfets, demoMotors } from '../../db/seeds/data/index.ts';
import { demoDesigns } from '../../db/seeds/designs.ts';
import { CHECK_LABELS, checkLabel, checkLabelInline, checkLabelList } from '../../src/lib/design-words.ts';
import { matchDesign, type MatchCatalogue } from '../../src/lib/design-match.ts';
import type { DesignInput } from '../../src/lib/domain/design.ts';
import type { PartOf } from '../../src/lib/domain/parts.ts';

const LIB = path.resolve(import.meta.dirname, '../../src/lib');

/** Ids written in the source of the files that build checks (they import from ./checks.ts). */
function idsFromSource(): Map<string, string> {
  const found = new Map<string, string>();
  for (const file of readdirSync(LIB).filter((f) => f.endsWith('.ts'))) {
    const text = readFileSync(path.join(LIB, file), 'utf8');
    if (!/from '\.\/checks\.ts'/.test(text) || !/makeCheck\(|: Check\b|Check\[\]/.test(text)) continue;
    for (const m of text.matchAll(/\bid: '([a-z0-9-]+)'|\bconst id = '([a-z0-9-]+)'/g)) found.set(m[1] ?? m[2], file);
  }
  return found;
}

let nextId = 1;
const withIds = <T extends object>(list: readonly T[]): (T & { id: number; version: number })[] =>
  list.map((p) => ({ ...p, id: nextId++, version: 1 }));
const catalogue: MatchCatalogue = {
  mosfets: withIds(demoMosfets) as PartOf<'mosfet'>[],
  drivers: withIds(demoDrivers) as PartOf<'driver'>[],
  diodes: withIds(demoDiodes) as PartOf<'diode'>[],
  excluded: { switch: 0, driver: 0, diode: 0 },
};
const none = { chosenPartId: null, alternatePartIds: [] };

/** Ids in the outputs of the whole matching (switch, switch with driver, driver, diode, supply) for each demo design. */
function idsFromOutputs(): Set<string> {
  const ids = new Set<string>();
  for (const demo of demoDesigns) {
    const { motorMpn, ready: _ready, ...rest } = demo;
    const motor = demoMotors.find((m) => m.mpn === motorMpn)!;
    const input = {
      ...rest,
      motor: { source: 'catalogue', partId: 1 },
      selections: { switch: none, driver: none, diode: none },
    } as DesignInput;
    const match = matchDesign(input, motor.mpn, motor.params, catalogue);
    for (const list of [match.switch, match.switchWithDriver, match.driver, match.diode])
      for (const e of list) for (const c of e.checks) ids.add(c.id);
    for (const c of match.supply?.checks ?? []) ids.add(c.id);
  }
  return ids;
}

describe('every check id the engines emit has a label', () => {
  const source = idsFromSource();
  const outputs = idsFromOutputs();

  it('the source scan finds the checks of every engine (hand-picked ids, one or more per engine file)', () => {
    for (const id of [
      'drain-voltage',
      'stall-thermal',
      'reverse-recovery',
      'diode-thermal',
      'duty-error',
      'paired-switch',
      'logic-brownout',
      'supply-motor-voltage',
    ])
      expect(source.has(id), id).toBe(true);
  });

  it('no id in the engines’ source is missing from CHECK_LABELS', () => {
    const missing = [...source.keys()].filter((id) => !(id in CHECK_LABELS)).map((id) => `${id} (${source.get(id)})`);
    expect(missing).toEqual([]);
  });

  it('no id in the engines’ outputs for the demo designs is missing, and each one is also found in the source', () => {
    expect(outputs.size).toBeGreaterThan(15);
    expect([...outputs].filter((id) => !(id in CHECK_LABELS))).toEqual([]);
    expect([...outputs].filter((id) => !source.has(id))).toEqual([]);
  });

  it('no label is left over for an id no engine emits any more', () => {
    expect(Object.keys(CHECK_LABELS).filter((id) => !source.has(id))).toEqual([]);
  });
});

describe('label forms (hand-written table)', () => {
  it.each([
    ['drain-voltage', 'Drain voltage rating', 'drain voltage rating'],
    ['rdson-test-current', 'RDS(on) test current', 'RDS(on) test current'],
    ['logic-brownout', 'Shared controller rail at start (brown-out)', 'shared controller rail at start (brown-out)'],
    ['supply-start-current', 'Start current against the source’s current limit', 'start current against the source’s current limit'],
  ])('%s', (id, label, inline) => {
    expect(checkLabel(id)).toBe(label);
    expect(checkLabelInline(id)).toBe(inline);
  });

  it('a list keeps names with a comma apart', () => {
    expect(checkLabelList(['stall-thermal', 'gate-drive'])).toBe('junction temperature, jammed shaft; gate drive level');
  });
});
