import type { Knex } from 'knex';
import { envSetting } from './lib/env';

// Used by the migration scripts and the app alike; DATABASE_URL is set by `npm start`, `npm test`
// or the deployment.
const config: Knex.Config = {
  client: 'pg',
  connection: process.env.DATABASE_URL,
  pool: { min: 0, max: envSetting('DATABASE_POOL_MAX') },
  migrations: {
    directory: './db/migrations',
    extension: 'ts',
    loadExtensions: ['.ts'],
    tableName: 'knex_migrations',
  },
};

export default config;
