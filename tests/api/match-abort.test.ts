/**
 * A match whose client has gone away stops: between its steps (catalogue loads, rankings, pricing) the
 * request's abort signal is read, and nothing after an abort runs. Probe: the steps the match reports
 * reaching (MatchWatch.onStep), not a sleep. The AG-3 demo design (1.8 V logic, no driver chosen) needs
 * both drive phases, so a whole match passes five steps; aborted after ranking the direct phase it must
 * not load the driver-phase catalogue, rank it or price anything. Inside a ranking the match pauses between
 * slices of parts (MatchWatch.onSlice); aborted at the first pause, the rest of that ranking does not run.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { appDb } from '../helpers/stack.ts';
import { loadDesign } from '../../src/server/repos/designs.ts';
import { matchPageOf, type MatchStep } from '../../src/server/services/designs.ts';
import { ServiceError } from '../../src/server/services/errors.ts';
import type { DesignInput } from '../../src/lib/domain/design.ts';

const knex = appDb();
afterAll(() => knex.destroy());

const none = { chosenPartId: null, alternatePartIds: [] };

async function agitatorWithoutPicks(): Promise<DesignInput> {
  const row = await knex('designs').where('name', 'like', 'AG-3%').first('id');
  const input = (await loadDesign(knex, row.id))!.input;
  return { ...input, selections: { switch: none, driver: none, diode: none } };
}

describe('an aborted match', () => {
  it('without an abort passes every step of both drive phases', async () => {
    const input = await agitatorWithoutPicks();
    const steps: MatchStep[] = [];
    let pauses = 0;
    const page = await matchPageOf(input, false, { offset: 0, limit: 5 }, knex, undefined, {
      signal: new AbortController().signal,
      onStep: (s) => steps.push(s),
      onSlice: () => pauses++,
    });
    expect(steps).toEqual(['loaded-direct', 'ranked-direct', 'loaded-driver', 'ranked-driver', 'priced']);
    expect(page.driverNeeded).toBe(true);
    // Each phase pauses at least before its diode sort and its switch sort.
    expect(pauses).toBeGreaterThanOrEqual(4);
  });

  it('stops inside a ranking: aborted at its first pause, it reaches no later pause and no later step', async () => {
    const input = await agitatorWithoutPicks();
    const steps: MatchStep[] = [];
    let pauses = 0;
    const client = new AbortController();
    const err = await matchPageOf(input, false, { offset: 0, limit: 5 }, knex, undefined, {
      signal: client.signal,
      onStep: (s) => steps.push(s),
      onSlice: () => {
        pauses++;
        client.abort();
      },
    }).then(
      () => null,
      (e: unknown) => e,
    );
    expect(err).toBeInstanceOf(ServiceError);
    expect((err as ServiceError).status).toBe(503);
    expect(steps).toEqual(['loaded-direct']);
    expect(pauses).toBe(1);
  });

  it('stops at the next step: no driver-phase load, ranking or pricing after the client left', async () => {
    const input = await agitatorWithoutPicks();
    const steps: MatchStep[] = [];
    const client = new AbortController();
    const run = matchPageOf(input, false, { offset: 0, limit: 5 }, knex, undefined, {
      signal: client.signal,
      onStep: (s) => {
        steps.push(s);
        if (s === 'ranked-direct') client.abort();
      },
    });
    const err = await run.then(
      () => null,
      (e: unknown) => e,
    );
    expect(err).toBeInstanceOf(ServiceError);
    expect((err as ServiceError).status).toBe(503);
    expect(steps).toEqual(['loaded-direct', 'ranked-direct']);
  });

  it('a signal aborted before the first load stops after it', async () => {
    const input = await agitatorWithoutPicks();
    const steps: MatchStep[] = [];
    const client = new AbortController();
    client.abort();
    await expect(
      matchPageOf(input, false, { offset: 0, limit: 5 }, knex, undefined, { signal: client.signal, onStep: (s) => steps.push(s) }),
    ).rejects.toBeInstanceOf(ServiceError);
    expect(steps).toEqual(['loaded-direct']);
  });
});
