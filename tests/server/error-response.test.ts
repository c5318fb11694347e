/**
 * The last-resort handler: an unexpected error becomes a JSON 500 in the one error shape with an id, and
 * the same id is in the log line (so a reported answer leads to its stack trace); a refusal keeps its status.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { errorResponse } from '../../src/server/http/error-response.ts';
import { ServiceError } from '../../src/server/services/errors.ts';

afterEach(() => vi.restoreAllMocks());

describe('errorResponse', () => {
  it('an unexpected error → 500 JSON {error, issues, errorId}, the id logged with the error', async () => {
    const log = vi.spyOn(console, 'error').mockImplementation(() => {});
    const res = errorResponse(new TypeError('boom'), true);
    expect(res.status).toBe(500);
    expect(res.headers.get('content-type')).toMatch(/application\/json/);
    const body = await res.json();
    expect(body.errorId).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/);
    expect(body.issues).toEqual([]);
    expect(body.error).toContain(body.errorId);
    expect(log).toHaveBeenCalledTimes(1);
    expect(String(log.mock.calls[0][0])).toContain(body.errorId);
    expect(log.mock.calls[0][1]).toBeInstanceOf(TypeError);
  });

  it('two errors get two ids', async () => {
    vi.spyOn(console, 'error').mockImplementation(() => {});
    const a = await errorResponse(new Error('a'), true).json();
    const b = await errorResponse(new Error('b'), true).json();
    expect(a.errorId).not.toBe(b.errorId);
  });

  it('a refusal keeps its status and logs nothing', async () => {
    const log = vi.spyOn(console, 'error').mockImplementation(() => {});
    const res = errorResponse(new ServiceError(413, 'Too big.', [{ path: 'file', message: 'at most 1 byte' }]), true);
    expect(res.status).toBe(413);
    expect(await res.json()).toEqual({ error: 'Too big.', issues: [{ path: 'file', message: 'at most 1 byte' }] });
    expect(log).not.toHaveBeenCalled();
  });
});
