/** The start/test scripts' teardown: newest first, each step once, a failing step does not stop the rest. */
import { describe, expect, it, vi } from 'vitest';
import { Teardown } from '../../scripts/stack/teardown.ts';
import { StackError, fail } from '../../scripts/stack/log.ts';

describe('Teardown', () => {
  it('runs steps newest first, once, even when one throws', async () => {
    const order: string[] = [];
    const t = new Teardown();
    t.add('db', () => void order.push('db'));
    t.add('sink', () => {
      order.push('sink');
      throw new Error('sink refused');
    });
    t.add('http', async () => void order.push('http'));
    expect(t.pending()).toEqual(['http', 'sink', 'db']);
    const log = vi.spyOn(console, 'log').mockImplementation(() => undefined);
    await Promise.all([t.run(), t.run()]);
    await t.run();
    log.mockRestore();
    expect(order).toEqual(['http', 'sink', 'db']);
    expect(t.pending()).toEqual([]);
  });

  it('fail() throws a StackError instead of exiting the process', () => {
    const exit = vi.spyOn(process, 'exit');
    expect(() => fail('MariaDB did not start')).toThrow(StackError);
    expect(exit).not.toHaveBeenCalled();
    exit.mockRestore();
  });
});
