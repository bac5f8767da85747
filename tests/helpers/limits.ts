import { testDb } from './fixtures';

/**
 * Every test request comes from the same loopback address, and the app counts per client address.
 * Tests that spend a client's allowance give it back, so later tests (and the browser suite) are not
 * refused for what an earlier test did.
 */
export async function resetClientLimits() {
  await testDb()('rate_limits').where('key', 'like', 'signin-ip:%').orWhere('key', 'like', 'link-ip:%').delete();
}

export async function limiterKeys(prefix: string) {
  const rows = (await testDb()('rate_limits').where('key', 'like', `${prefix}:%`).select('key', 'points')) as { key: string; points: number }[];
  return new Map(rows.map((r) => [r.key.slice(prefix.length + 1), Number(r.points)]));
}
