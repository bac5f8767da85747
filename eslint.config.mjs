import js from '@eslint/js';
import tseslint from 'typescript-eslint';

const QUERY_WALL = 'Only lib/server/queries calls the query builder: add a query function there.';

const ioModules = ['fs', 'node:*', 'knex', 'pg', 'react', 'react-dom', 'next', 'next/*', '@aws-sdk/*', 'nodemailer', 'sharp'];

export default tseslint.config(
  {
    ignores: [
      '.next/**',
      '.next-slot-*/**',
      'node_modules/**',
      '.data/**',
      'coverage/**',
      'public/sw.js',
      'test-results/**',
      'playwright-report/**',
      'next-env.d.ts',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: {
      globals: {
        console: 'readonly',
        process: 'readonly',
        window: 'readonly',
        document: 'readonly',
        location: 'readonly',
        fetch: 'readonly',
        URL: 'readonly',
        URLSearchParams: 'readonly',
        setTimeout: 'readonly',
        Buffer: 'readonly',
        __dirname: 'readonly',
      },
    },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      'no-restricted-imports': [
        'error',
        {
          patterns: [{ group: ['knex', 'pg'], message: 'Database access lives in lib/server/ (queries/ for SQL) and db/ only.' }],
        },
      ],
    },
  },
  {
    // Places that may talk to PostgreSQL directly.
    files: ['lib/server/**', 'db/**', 'scripts/**', 'knexfile.ts', 'tests/**'],
    rules: { 'no-restricted-imports': 'off' },
  },
  {
    files: ['lib/viticulture/**'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ioModules, message: 'lib/viticulture is pure: no I/O, no framework imports.' },
            { group: ['@/*'], message: 'lib/viticulture imports only its own modules.' },
          ],
        },
      ],
    },
  },
  {
    files: ['db/migrations/**'],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: [{ group: ['@/*', '../../lib/*', '../../app/*'], message: 'Migrations never import app code: they must not change once landed.' }] },
      ],
    },
  },
  {
    files: ['components/**', 'app/**/*.tsx'],
    ignores: ['app/**/page.tsx', 'app/**/layout.tsx'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['knex', 'pg', '@/lib/server/db', '@/lib/server/queries/*'],
              message: 'UI components get data from pages, route handlers or server actions.',
            },
          ],
        },
      ],
    },
  },
  {
    // Screens call the app's API through lib/api-client.ts: one deadline, one ApiError, the server's message.
    files: ['components/**', 'app/**/*.tsx'],
    rules: {
      'no-restricted-globals': ['error', { name: 'fetch', message: 'Call the API with apiGet / apiSend from lib/api-client.ts.' }],
    },
  },
  {
    // A route handler parses, makes one service call and responds: reads and writes go through lib/server/services.
    files: ['app/api/**'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['knex', 'pg', '@/lib/server/db', '@/lib/server/queries/*'],
              message: 'A route handler calls a service (lib/server/services); queries live behind it.',
            },
          ],
        },
      ],
    },
  },
  {
    // Client code: components and lib/ outside lib/server. Type-only imports count too: the shared types live in lib/contracts.
    files: ['components/**', 'lib/**'],
    ignores: ['lib/server/**'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['knex', 'pg'], message: 'Database access lives in lib/server/ (queries/ for SQL) and db/ only.' },
            {
              group: ['@/app/*', '@/app/**', '**/app/*'],
              message: 'Components and lib/ never import app/: a page passes what they need (server actions as props).',
            },
            {
              group: ['@/lib/server/*', '@/lib/server/**', '**/server/*'],
              message: 'Client code never imports lib/server, types included: use lib/contracts.',
            },
          ],
        },
      ],
    },
  },
  {
    files: ['lib/grid/**', 'lib/reports/**', 'lib/validation/**', 'lib/contracts/**'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ioModules, message: 'This module is pure: no I/O, no framework imports.' },
            {
              group: ['@/app/*', '@/app/**', '@/lib/server/*', '@/lib/server/**', '@/components/*', '@/components/**'],
              message: 'This module is pure: no app, server or UI imports.',
            },
          ],
        },
      ],
      'no-restricted-globals': ['error', { name: 'fetch', message: 'This module is pure: the API client is lib/api-client.ts.' }],
    },
  },
  {
    // Query-builder use belongs in lib/server/queries (db/, scripts/ and tests/ aside).
    files: ['app/**', 'lib/**', 'components/**', 'proxy.ts', 'instrumentation*.ts'],
    // The next-auth adapter is itself a query module in next-auth's shape.
    ignores: ['lib/server/queries/**', 'lib/server/db.ts', 'lib/server/auth/adapter.ts'],
    rules: {
      'no-restricted-syntax': [
        'error',
        // db()('table'), trx('table'), conn('table'): a query built here instead of in lib/server/queries.
        { selector: "CallExpression[callee.type='CallExpression'][callee.callee.name='db']", message: QUERY_WALL },
        { selector: 'CallExpression[callee.name=/^(trx|conn|knex|database)$/]', message: QUERY_WALL },
        {
          selector: "CallExpression[callee.property.name=/^(raw|schema|fn)$/][callee.object.type='CallExpression'][callee.object.callee.name='db']",
          message: QUERY_WALL,
        },
        { selector: 'CallExpression[callee.property.name=/^(raw|schema|fn)$/][callee.object.name=/^(trx|conn|knex|database)$/]', message: QUERY_WALL },
      ],
    },
  },
);
