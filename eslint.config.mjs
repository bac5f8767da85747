import js from '@eslint/js';
import tseslint from 'typescript-eslint';

const ioModules = ['fs', 'node:*', 'knex', 'pg', 'react', 'react-dom', 'next', 'next/*', '@aws-sdk/*', 'nodemailer', 'sharp'];

export default tseslint.config(
  { ignores: ['.next/**', '.next-slot-*/**', 'node_modules/**', '.data/**', 'coverage/**', 'public/sw.js', 'test-results/**', 'playwright-report/**', 'next-env.d.ts'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { console: 'readonly', process: 'readonly', window: 'readonly', document: 'readonly', location: 'readonly', fetch: 'readonly', URL: 'readonly', URLSearchParams: 'readonly', setTimeout: 'readonly', Buffer: 'readonly', __dirname: 'readonly' } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['knex', 'pg'], message: 'Database access lives in lib/server/ (queries/ for SQL) and db/ only.' },
          ],
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
        { patterns: [{ group: ioModules, message: 'lib/viticulture is pure: no I/O, no framework imports.' }, { group: ['@/*'], message: 'lib/viticulture imports only its own modules.' }] },
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
        { patterns: [{ group: ['knex', 'pg', '@/lib/server/db', '@/lib/server/queries/*'], message: 'UI components get data from pages, route handlers or server actions.' }] },
      ],
    },
  },
);
