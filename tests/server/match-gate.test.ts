/** The per-server match limit: K run, the next is refused at once with 429 and Retry-After; a slot frees on finish or failure. */
import { describe, expect, it } from 'vitest';
import { matchesRunning, withMatchSlot } from '../../src/server/services/match-gate.ts';
import { ServiceError } from '../../src/server/services/errors.ts';

describe('withMatchSlot', () => {
  it('runs K at once, refuses the K+1st with 429 and Retry-After, and frees slots afterwards', async () => {
    const release: (() => void)[] = [];
    const held = [0, 1].map(() => withMatchSlot(() => new Promise<number>((r) => release.push(() => r(1))), 2));
    expect(matchesRunning()).toBe(2);
    const refused = await withMatchSlot(async () => 3, 2).catch((e: unknown) => e);
    expect(refused).toBeInstanceOf(ServiceError);
    expect((refused as ServiceError).status).toBe(429);
    expect((refused as ServiceError).headers['Retry-After']).toBe('1');
    release.forEach((r) => r());
    await Promise.all(held);
    expect(matchesRunning()).toBe(0);
    await expect(withMatchSlot(() => Promise.reject(new Error('boom')), 2)).rejects.toThrow('boom');
    expect(matchesRunning()).toBe(0);
    await expect(withMatchSlot(async () => 4, 2)).resolves.toBe(4);
  });
});
