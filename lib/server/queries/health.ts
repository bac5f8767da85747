import 'server-only';
import type { Db } from '@/lib/server/db';

/** The cheapest round trip PostgreSQL answers. */
export const pingDatabase = (db: Db) => db.raw('select 1').then(() => true);

/** Bounds every statement of the current transaction: PostgreSQL cancels one that runs longer. */
export const setLocalStatementTimeout = (trx: Db, ms: number) => trx.raw(`set local statement_timeout = ${Math.floor(ms)}`);
