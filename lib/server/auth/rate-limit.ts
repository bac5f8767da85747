import 'server-only';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { clientAddress } from '@/lib/client-address';
import { getEnv } from '@/lib/env';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';

/**
 * Sign-in attempts are counted per client address and per account, in PostgreSQL so that every
 * app server sees the same counts. For passwords only failures count: a person who signs in every
 * morning is never locked out, a password guesser is. For e-mail links every request counts, since
 * each one sends a mail: per address so nobody's inbox is flooded, per client so nobody probes or
 * spams through many addresses. Unknown addresses are counted exactly like known ones, so the
 * limits tell nothing about who has an account.
 */
const WINDOW_S = 15 * 60;

type Limiters = { ip: RateLimiterPostgres; account: RateLimiterPostgres; linkIp: RateLimiterPostgres; linkAddress: RateLimiterPostgres };
const store = globalThis as unknown as { vinewardLimiters?: Limiters };

const limiter = (keyPrefix: string, points: number) =>
  new RateLimiterPostgres({ storeClient: db(), storeType: 'knex', tableName: 'rate_limits', tableCreated: true, keyPrefix, points, duration: WINDOW_S });

function limiters() {
  store.vinewardLimiters ??= {
    ip: limiter('signin-ip', 30),
    account: limiter('signin-account', 10),
    linkIp: limiter('link-ip', 20),
    linkAddress: limiter('link-address', 5),
  };
  return store.vinewardLimiters;
}

function tooMany(res: RateLimiterRes, message: (wait: string) => string): never {
  const minutes = Math.max(1, Math.ceil(res.msBeforeNext / 60_000));
  throw new AppError('rate-limited', message(`${minutes} minute${minutes === 1 ? '' : 's'}`), undefined, {
    'Retry-After': String(Math.ceil(res.msBeforeNext / 1000)),
  });
}

/**
 * The key an account is counted under, from the e-mail exactly as next-auth handed it over (a
 * string, or whatever a JSON body held): the same function runs before next-auth and inside it.
 */
export const accountKey = (email: unknown) =>
  String(email ?? '')
    .normalize('NFKC')
    .trim()
    .toLowerCase();

async function passwordLock(ip: string, key: string) {
  const { ip: byIp, account } = limiters();
  const [a, b] = await Promise.all([byIp.get(ip), account.get(key)]);
  if (a && a.consumedPoints >= byIp.points) return a;
  if (b && b.consumedPoints >= account.points) return b;
  return undefined;
}

/** Throws a 429 AppError when this address or account has used up its failures. */
export async function assertSignInAllowed(ip: string, key: string) {
  const locked = await passwordLock(ip, key);
  if (locked) tooMany(locked, (wait) => `Too many failed sign-in attempts. Wait ${wait} and try again, or use an e-mail sign-in link.`);
}

/** The same test inside next-auth, on the credentials it actually reads. */
export const signInLocked = async (ip: string, key: string) => !!(await passwordLock(ip, key));

export async function recordFailedSignIn(ip: string, key: string) {
  const { ip: byIp, account } = limiters();
  await Promise.allSettled([byIp.penalty(ip, 1), account.penalty(key, 1)]);
}

export async function clearFailedSignIns(key: string) {
  await limiters().account.delete(key);
}

/** Counts one e-mail link request; throws a 429 AppError when the client or the address is over its limit. */
export async function consumeLinkRequest(ip: string, address: string) {
  const { linkIp, linkAddress } = limiters();
  const results = await Promise.allSettled([linkIp.consume(ip), linkAddress.consume(address)]);
  for (const r of results) {
    if (r.status === 'fulfilled') continue;
    if (r.reason instanceof RateLimiterRes) tooMany(r.reason, (wait) => `Too many sign-in links were asked for. Wait ${wait} and try again.`);
    throw r.reason;
  }
}

/** The client address to count against, as the configured proxies report it (0 = no proxy). */
export const requestAddress = (headers: Headers | Record<string, unknown> | undefined) => clientAddress(headers, getEnv().TRUSTED_PROXY_HOPS);
