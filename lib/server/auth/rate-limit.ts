import 'server-only';
import { RateLimiterPostgres, type RateLimiterRes } from 'rate-limiter-flexible';
import { clientAddress } from '@/lib/client-address';
import { getEnv } from '@/lib/env';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';

/**
 * Failed sign-ins are counted per client address and per account, in PostgreSQL so that every
 * app server sees the same counts. Only failures count: a person who signs in every morning is
 * never locked out, a password guesser is.
 */
const WINDOW_S = 15 * 60;

const store = globalThis as unknown as { vinewardLimiters?: { ip: RateLimiterPostgres; account: RateLimiterPostgres } };

function limiters() {
  store.vinewardLimiters ??= {
    ip: new RateLimiterPostgres({
      storeClient: db(), storeType: 'knex', tableName: 'rate_limits', tableCreated: true,
      keyPrefix: 'signin-ip', points: 30, duration: WINDOW_S,
    }),
    account: new RateLimiterPostgres({
      storeClient: db(), storeType: 'knex', tableName: 'rate_limits', tableCreated: true,
      keyPrefix: 'signin-account', points: 10, duration: WINDOW_S,
    }),
  };
  return store.vinewardLimiters;
}

function tooMany(res: RateLimiterRes): never {
  const minutes = Math.max(1, Math.ceil(res.msBeforeNext / 60_000));
  throw new AppError(
    'rate-limited',
    `Too many failed sign-in attempts. Wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again, or use an e-mail sign-in link.`,
    undefined,
    { 'Retry-After': String(Math.ceil(res.msBeforeNext / 1000)) },
  );
}

/** Throws a 429 AppError when this address or account has used up its failures. */
export async function assertSignInAllowed(ip: string, email: string) {
  const { ip: byIp, account } = limiters();
  const [a, b] = await Promise.all([byIp.get(ip), account.get(email.toLowerCase())]);
  for (const res of [a, b]) if (res && res.consumedPoints >= (res === a ? byIp.points : account.points)) tooMany(res);
}

export async function recordFailedSignIn(ip: string, email: string) {
  const { ip: byIp, account } = limiters();
  await Promise.allSettled([byIp.penalty(ip, 1), account.penalty(email.toLowerCase(), 1)]);
}

export async function clearFailedSignIns(email: string) {
  await limiters().account.delete(email.toLowerCase());
}

/** The client address to count failures against, as the configured proxies report it. */
export const requestAddress = (headers: Headers | Record<string, unknown> | undefined) => clientAddress(headers, getEnv().TRUSTED_PROXY_HOPS);
