import 'server-only';
import knex, { type Knex } from 'knex';
import { getEnv } from '@/lib/env';

// One pool per process; kept on globalThis so that dev-mode reloads do not open new pools.
const store = globalThis as unknown as { vinewardDb?: Knex };

export function db(): Knex {
  store.vinewardDb ??= knex({
    client: 'pg',
    connection: getEnv().DATABASE_URL,
    pool: { min: 0, max: Number(process.env.DATABASE_POOL_MAX ?? 10) },
  });
  return store.vinewardDb;
}

export type Db = Knex | Knex.Transaction;
