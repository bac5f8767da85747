import knex from 'knex';
import config from '../../knexfile';

/** Runs Knex migrations (TypeScript, loaded through tsx) against the given database. */
export async function migrate(databaseUrl: string, direction: 'latest' | 'rollback-all' = 'latest') {
  const instance = knex({ ...config, connection: databaseUrl });
  try {
    if (direction === 'latest') {
      const [, applied] = await instance.migrate.latest();
      return applied as string[];
    }
    const [, reverted] = await instance.migrate.rollback(undefined, true);
    return reverted as string[];
  } finally {
    await instance.destroy();
  }
}
