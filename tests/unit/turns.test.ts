/**
 * Jobs taking turns of the event loop (src/server/turns.ts): however many wait, one resumes per turn, in
 * the order they asked. A probe that re-queues itself with setImmediate counts the turns (Node.js timers
 * docs: an immediate queued while immediates run waits for the next turn). With a plain setImmediate per
 * job, all three jobs below would resume in the same turn; here no two share one.
 */
import { describe, expect, it } from 'vitest';
import { nextTurn, turnsWaiting } from '../../src/server/turns.ts';

describe('nextTurn', () => {
  it('three jobs of four slices: one slice per turn of the loop, round robin', async () => {
    let turn = 0;
    let probing = true;
    const probe = () => {
      turn++;
      if (probing) setImmediate(probe);
    };
    setImmediate(probe);
    const resumed: { job: string; turn: number }[] = [];
    const job = async (name: string) => {
      for (let i = 0; i < 4; i++) {
        await nextTurn();
        resumed.push({ job: name, turn });
      }
    };
    await Promise.all([job('a'), job('b'), job('c')]);
    probing = false;
    expect(resumed.map((r) => r.job).join('')).toBe('abcabcabcabc');
    const turns = resumed.map((r) => r.turn);
    expect(new Set(turns).size).toBe(turns.length);
    for (let i = 1; i < turns.length; i++) expect(turns[i]).toBeGreaterThan(turns[i - 1]);
    expect(turnsWaiting()).toBe(0);
  });

  it('a plain setImmediate per job resumes them all in one turn (the behaviour this replaces)', async () => {
    let turn = 0;
    let probing = true;
    const probe = () => {
      turn++;
      if (probing) setImmediate(probe);
    };
    setImmediate(probe);
    const seen: number[] = [];
    await Promise.all(
      ['a', 'b', 'c'].map(async () => {
        await new Promise<void>((resolve) => setImmediate(resolve));
        seen.push(turn);
      }),
    );
    probing = false;
    expect(new Set(seen).size).toBe(1);
  });
});
