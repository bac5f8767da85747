import 'server-only';
import { AppError } from '@/lib/server/errors';

/** PostgreSQL error classes meaning "the database is not there or gave up", not "your request is wrong". */
const PG_DOWN = /^(08|57P0[1-3]|53300|57014|25P03)/;
const NET_DOWN = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENOTFOUND', 'EAI_AGAIN']);
// nodemailer's codes for a mail server it cannot reach or that stopped answering.
const SMTP_DOWN = new Set(['ECONNECTION', 'ETIMEDOUT', 'ESOCKET', 'EDNS', 'EPROTOCOL']);
const PG_MESSAGES = /Connection terminated|Query read timeout|timeout exceeded when trying to connect|Client has encountered a connection error/i;

const RETRY_SECONDS = '10';

/**
 * A failed call to PostgreSQL or the mail server, as 503 with Retry-After: the request was fine,
 * a service it needs is slow or down. Object storage errors are turned into 503 where they are
 * called (lib/server/storage.ts). Answers undefined for anything else.
 */
export function asUnavailable(err: unknown): AppError | undefined {
  const e = err as { name?: string; code?: string; message?: string; command?: string };
  if (!e || typeof e !== 'object') return undefined;
  const unavailable = (what: string) =>
    new AppError('unavailable', `${what} is not answering right now. Nothing you sent was lost; try again shortly.`, undefined, {
      'retry-after': RETRY_SECONDS,
    });
  if (e.name === 'KnexTimeoutError') return unavailable('The database');
  if (typeof e.code === 'string' && PG_DOWN.test(e.code)) return unavailable('The database');
  if (PG_MESSAGES.test(e.message ?? '')) return unavailable('The database');
  // nodemailer sets `command` (CONN, EHLO, DATA …) on what it throws.
  if (e.command !== undefined && SMTP_DOWN.has(e.code ?? '')) return unavailable('The mail server');
  if (NET_DOWN.has(e.code ?? '')) return unavailable('A service Vineward needs');
  return undefined;
}
