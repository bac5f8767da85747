import { describe, expect, it } from 'vitest';
import { asUnavailable } from '@/lib/server/unavailable';

describe('asUnavailable', () => {
  it('turns a database or mail server that is down or slow into 503 with Retry-After', () => {
    const cases = [
      Object.assign(new Error('Knex: Timeout acquiring a connection. The pool is probably full.'), { name: 'KnexTimeoutError' }),
      Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:5432'), { code: 'ECONNREFUSED' }),
      Object.assign(new Error('canceling statement due to statement timeout'), { code: '57014' }),
      Object.assign(new Error('terminating connection due to administrator command'), { code: '57P01' }),
      new Error('Connection terminated unexpectedly'),
      Object.assign(new Error('Greeting never received'), { code: 'ETIMEDOUT', command: 'CONN' }),
    ];
    for (const err of cases) {
      const mapped = asUnavailable(err);
      expect(mapped?.status, err.message).toBe(503);
      expect(Number(mapped?.headers?.['retry-after'])).toBeGreaterThan(0);
    }
  });

  it('leaves request errors and bugs alone', () => {
    expect(asUnavailable(Object.assign(new Error('duplicate key'), { code: '23505' }))).toBeUndefined();
    expect(asUnavailable(new TypeError('x is undefined'))).toBeUndefined();
    expect(asUnavailable(Object.assign(new Error('Invalid login'), { code: 'EAUTH', command: 'AUTH PLAIN' }))).toBeUndefined();
    expect(asUnavailable(undefined)).toBeUndefined();
  });
});
