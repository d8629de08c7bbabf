import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { errorResponse, HttpError, idParam, parseWith, translateDriverError } from '../../src/lib/server/http.ts';
import { allows } from '../../src/lib/server/auth.ts';

describe('JSON errors', () => {
  it('turns an HttpError into its status and the {error: {code, message, fields}} body', async () => {
    const r = errorResponse(new HttpError(409, 'stale_version', 'The plan changed', { version: 'stale' }));
    expect(r.status).toBe(409);
    expect(await r.json()).toEqual({ error: { code: 'stale_version', message: 'The plan changed', fields: { version: 'stale' } } });
  });

  it('maps MariaDB duplicate-key and foreign-key errors to 409, not 500', () => {
    expect(translateDriverError({ code: 'ER_DUP_ENTRY' })?.status).toBe(409);
    expect(translateDriverError({ code: 'ER_NO_REFERENCED_ROW_2' })?.status).toBe(409);
    expect(translateDriverError({ code: 'ER_ROW_IS_REFERENCED_2' })?.status).toBe(409);
    expect(translateDriverError(new Error('boom'))).toBeNull();
  });

  it('answers an unexpected error with 500 and a log id, never the stack', async () => {
    const original = console.error;
    console.error = () => {};
    const r = errorResponse(new Error('secret detail'));
    console.error = original;
    const body = await r.json();
    expect(r.status).toBe(500);
    expect(body.error.message).toMatch(/log id [0-9a-f-]{36}/);
    expect(JSON.stringify(body)).not.toMatch(/secret detail/);
  });

  it('names every failing field of a zod schema in a 400', () => {
    const schema = z.object({ a: z.number(), b: z.object({ c: z.string() }) });
    try {
      parseWith(schema, { a: 'x', b: {} });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(HttpError);
      expect((e as HttpError).status).toBe(400);
      expect(Object.keys((e as HttpError).fields!)).toEqual(['a', 'b.c']);
    }
  });

  it('treats a malformed id as a missing record (404)', () => {
    expect(idParam('12')).toBe(12);
    for (const bad of ['0', '-1', 'abc', '1.5', '', undefined, '12345678901']) expect(() => idParam(bad)).toThrow(HttpError);
  });
});

describe('role rules', () => {
  it('lets a lead do what a dispatcher may, and a farrier only signed-in things', () => {
    expect(allows('dispatcher', 'lead')).toBe(true);
    expect(allows('dispatcher', 'dispatcher')).toBe(true);
    expect(allows('dispatcher', 'farrier')).toBe(false);
    expect(allows('lead', 'dispatcher')).toBe(false);
    expect(allows('signed-in', 'farrier')).toBe(true);
    expect(allows('signed-in', undefined)).toBe(false);
    expect(allows('public', undefined)).toBe(true);
  });
});
