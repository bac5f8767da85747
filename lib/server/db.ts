import 'server-only';
import knex, { type Knex } from 'knex';
import { getEnv } from '@/lib/env';

// One pool per process; kept on globalThis so that dev-mode reloads do not open new pools.
const store = globalThis as unknown as { vinewardDb?: Knex };

export function db(): Knex {
  if (!store.vinewardDb) {
    const env = getEnv();
    store.vinewardDb = knex({
      client: 'pg',
      connection: {
        connectionString: env.DATABASE_URL,
        connectionTimeoutMillis: env.DATABASE_CONNECT_TIMEOUT_MS,
        // Enforced by the server: a runaway query or a transaction left open by a stuck request
        // is ended there and its connection comes back to the pool.
        statement_timeout: env.DATABASE_STATEMENT_TIMEOUT_MS,
        idle_in_transaction_session_timeout: env.DATABASE_IDLE_IN_TRANSACTION_TIMEOUT_MS,
      },
      // Waiting for a free connection is bounded too: a full pool answers 503, not a hang.
      acquireConnectionTimeout: env.DATABASE_ACQUIRE_TIMEOUT_MS,
      pool: { min: 0, max: env.DATABASE_POOL_MAX },
    });
  }
  return store.vinewardDb;
}

export type Db = Knex | Knex.Transaction;
