/**
 * A match page is worked out from a lean ranking: every candidate judged for its verdict, score and failing
 * checks (no notes), and only the entries the page carries judged again in full. Second method: the full
 * ranking (every check of every candidate with its note) decorated and cut by pageMatch. On every demo
 * design, with no picks, with picks deep in a list, and with pages of several sizes, both give the same
 * page; the lean lists keep the full ranking's order, verdicts, scores and failing checks.
 */
import { describe, expect, it } from 'vitest';
import { demoDiodes, demoDrivers, demoMosfets, demoMotors } from '../../db/seeds/data/index.ts';
import { demoDesigns } from '../../db/seeds/designs.ts';
import {
  matchDesign,
  prepareCase,
  rankForMatch,
  rankForMatchLean,
  rankForMatchLeanSteps,
  type MatchCatalogue,
} from '../../src/lib/design-match.ts';
import { rankDesignLeanSteps } from '../../src/lib/rank-design.ts';
import { MATCH_LIST_KEYS, leanMatchPage, pageMatch } from '../../src/lib/match-page.ts';
import { withoutNotes, fmt } from '../../src/lib/checks.ts';
import type { DesignInput } from '../../src/lib/domain/design.ts';
import type { PartOf } from '../../src/lib/domain/parts.ts';

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
/** The same parts with a lifecycle other than active on every third and no sources on every fourth: ties broken by lifecycle. */
const mixed: MatchCatalogue = {
  ...catalogue,
  ...Object.fromEntries(
    (['mosfets', 'drivers', 'diodes'] as const).map((k) => [
      k,
      catalogue[k].map((p, i) => ({ ...p, lifecycle: i % 3 === 0 ? 'nrnd' : p.lifecycle, sources: i % 4 === 0 ? [] : p.sources })),
    ]),
  ),
};

function inputFor(name: string): { input: DesignInput; motor: (typeof demoMotors)[number] } {
  const demo = demoDesigns.find((d) => d.name === name)!;
  const { motorMpn, ready: _ready, ...rest } = demo;
  const motor = demoMotors.find((m) => m.mpn === motorMpn)!;
  return { input: { ...rest, motor: { source: 'catalogue', partId: 1 }, selections: { switch: none, driver: none, diode: none } }, motor };
}

/** The designer's picks taken from the end of each full list: entries far outside any first page. */
function withDeepPicks(input: DesignInput, motor: (typeof demoMotors)[number]): DesignInput {
  const full = matchDesign(input, motor.mpn, motor.params, catalogue);
  const last = (list: readonly { partId: number | null }[]) => list.filter((e) => e.partId != null).map((e) => e.partId as number);
  const sw = last(full.driverNeeded ? full.switchWithDriver : full.switch);
  const di = last(full.diode);
  return {
    ...input,
    selections: {
      switch: { chosenPartId: sw.at(-1) ?? null, alternatePartIds: sw.slice(-3, -1) },
      driver: none,
      diode: { chosenPartId: di.at(-1) ?? null, alternatePartIds: [] },
    },
  };
}

const failing = (checks: readonly { id: string; ok: boolean; severity?: string; value: number | null; limit: number | null }[]) =>
  checks.filter((c) => !c.ok).map((c) => ({ id: c.id, severity: c.severity, value: c.value, limit: c.limit }));

describe('notes left out', () => {
  it('fmt gives no digits inside withoutNotes and its usual text outside, also after a throw', () => {
    expect(fmt(1.23456)).toBe('1.23');
    expect(withoutNotes(() => fmt(1.23456))).toBe('');
    expect(() =>
      withoutNotes(() => {
        throw new Error('inside');
      }),
    ).toThrow('inside');
    expect(fmt(0.0471)).toBe('0.0471');
  });
});

describe.each(demoDesigns.map((d) => d.name))('lean ranking of "%s"', (name) => {
  const { input: bare, motor } = inputFor(name);
  const cases: [string, DesignInput][] = [
    ['no picks', bare],
    ['picks at the end of the lists', withDeepPicks(bare, motor)],
  ];

  it.each(cases)('keeps the full ranking’s order, verdicts, scores and failing checks (%s)', (_label, input) => {
    const prepared = prepareCase(input, motor.params);
    const full = rankForMatch(input, catalogue, prepared);
    const { ranking: lean } = rankForMatchLean(input, catalogue, prepared);
    expect(lean.driverNeeded).toBe(full.driverNeeded);
    expect(lean.switchDrive).toEqual(full.switchDrive);
    expect(lean.diodeForward).toEqual(full.diodeForward);
    expect(lean.driverNeededNote).toBe(full.driverNeededNote);
    expect(lean.powerOn).toEqual(full.powerOn);
    expect(lean.cautions).toEqual(full.cautions);
    for (const k of MATCH_LIST_KEYS) {
      expect(lean[k].map((e) => [e.partId, e.verdict, e.score, failing(e.checks)])).toEqual(
        full[k].map((e) => [e.partId, e.verdict, e.score, failing(e.checks)]),
      );
    }
    // Something is really left out: the checks that hold, and the numbers in the notes of those that fail.
    const leanChecks = MATCH_LIST_KEYS.flatMap((k) => lean[k].flatMap((e) => e.checks));
    const fullChecks = MATCH_LIST_KEYS.flatMap((k) => full[k].flatMap((e) => e.checks));
    expect(leanChecks.every((c) => !c.ok)).toBe(true);
    expect(fullChecks.length).toBeGreaterThan(leanChecks.length);
    const fullFailingNotes = fullChecks.filter((c) => !c.ok).map((c) => c.note);
    expect(leanChecks.map((c) => c.note)).not.toEqual(fullFailingNotes.length ? fullFailingNotes : ['(none)']);
  });

  it.each(cases)(
    'in slices of 1, 3 and 7 parts gives the same ranking and judges, pausing as often as the slices say (%s)',
    (_l, input) => {
      const prepared = prepareCase(input, motor.params);
      const whole = rankForMatchLean(input, catalogue, prepared);
      const sel = input.selections;
      const picks = { switchId: sel.switch.chosenPartId, driverId: sel.driver.chosenPartId, diodeId: sel.diode.chosenPartId };
      for (const slice of [1, 3, 7]) {
        const steps = rankDesignLeanSteps(
          prepared.designCase,
          catalogue,
          { ...picks, resetStartIntended: input.resetStartIntent != null },
          prepared.worstCase,
          slice,
        );
        let pauses = 0;
        let r = steps.next();
        for (; !r.done; r = steps.next()) pauses++;
        expect(r.value.ranking).toEqual(whole.ranking);
        // Every list of n parts judged in slices pauses ceil(n / slice) − 1 times, and once more before its sort:
        // at the least, the diodes and the switches are judged once each.
        const least = (n: number) => Math.ceil(n / slice) - 1 + 1;
        expect(pauses).toBeGreaterThanOrEqual(least(catalogue.diodes.length) + least(catalogue.mosfets.length));
        for (const part of catalogue.mosfets.slice(0, 5)) expect(r.value.judges.switch(part)).toEqual(whole.judges.switch(part));
        for (const part of catalogue.diodes.slice(0, 5)) expect(r.value.judges.diode(part)).toEqual(whole.judges.diode(part));
      }
    },
  );

  it.each(cases)(
    'with the diodes of an earlier phase carried over gives the ranking worked out afresh, and judges no diode again (%s)',
    (_l, input) => {
      const prepared = prepareCase(input, motor.params);
      // The first phase: the same case and diodes, switches narrowed to a few (as the pin-only phase is).
      const firstPhase: MatchCatalogue = { ...catalogue, mosfets: catalogue.mosfets.slice(0, 3) };
      const first = rankForMatchLean(input, firstPhase, prepared).ranking;
      const afresh = rankForMatchLean(input, catalogue, prepared).ranking;
      const count = (earlier?: { catalogue: MatchCatalogue; ranking: typeof first }) => {
        let judged = 0;
        const counting = {
          ...catalogue,
          diodes: catalogue.diodes.map((d) => new Proxy(d, { get: (t, k) => (k === 'params' && judged++, Reflect.get(t, k)) })),
        };
        const steps = rankForMatchLeanSteps(
          input,
          counting,
          prepared,
          earlier && { ...earlier, catalogue: { ...earlier.catalogue, diodes: counting.diodes } },
        );
        let r = steps.next();
        while (!r.done) r = steps.next();
        return { ranking: r.value.ranking, judged };
      };
      const carried = count({ catalogue: firstPhase, ranking: first });
      expect(carried.ranking).toEqual(afresh);
      expect(carried.judged).toBe(0);
      // Without it, or with a ranking made for another case (a hotter ambient), they are judged again,
      // and the answer is the one worked out afresh.
      const again = count();
      expect(again.ranking).toEqual(afresh);
      expect(again.judged).toBeGreaterThan(0);
      const hotter = { ...input, ambientMaxC: input.ambientMaxC + 10 };
      const otherCase = rankForMatchLean(hotter, firstPhase, prepareCase(hotter, motor.params)).ranking;
      const notCarried = count({ catalogue: firstPhase, ranking: otherCase });
      expect(notCarried.ranking).toEqual(afresh);
      expect(notCarried.judged).toBeGreaterThan(0);
    },
  );

  it.each(cases)('gives the pages of the full ranking, for every page size and offset (%s)', (_label, input) => {
    const prepared = prepareCase(input, motor.params);
    for (const parts of [catalogue, mixed]) {
      const whole = matchDesign(input, motor.mpn, motor.params, parts, prepared);
      const lean = rankForMatchLean(input, parts, prepared);
      const longest = Math.max(...MATCH_LIST_KEYS.map((k) => whole[k].length));
      for (const limit of [1, 4, 25]) {
        for (let offset = 0; offset < longest + limit; offset += limit) {
          const page = { offset, limit };
          expect(leanMatchPage(input, motor.mpn, motor.params, parts, prepared, lean, page)).toEqual(pageMatch(whole, input, page));
        }
      }
    }
  });
});
