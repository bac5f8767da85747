/** Each wall in eslint.config.mjs, shown to fire on a small snippet, so a rule cannot silently vanish. */
import path from 'node:path';
import { ESLint } from 'eslint';
import { describe, expect, it } from 'vitest';

const root = path.resolve(__dirname, '../..');
const eslint = new ESLint({ cwd: root });

async function messagesFor(file: string, code: string) {
  const [result] = await eslint.lintText(code, { filePath: path.join(root, file) });
  return result!.messages.map((m) => `${m.ruleId}: ${m.message}`);
}

const cases: [string, string, string, string][] = [
  [
    'a component importing app/',
    'components/x/wall.tsx',
    "import { inviteMember } from '@/app/(app)/team/actions';\nexport const a = inviteMember;\n",
    'no-restricted-imports',
  ],
  [
    'a component importing a server type',
    'components/x/wall.tsx',
    "import type { Member } from '@/lib/server/auth/guard';\nexport type A = Member;\n",
    'no-restricted-imports',
  ],
  [
    'client lib importing lib/server',
    'lib/offline/wall.ts',
    "import { AppError } from '@/lib/server/errors';\nexport const a = AppError;\n",
    'no-restricted-imports',
  ],
  ['lib/grid importing react', 'lib/grid/wall.ts', "import { useState } from 'react';\nexport const a = useState;\n", 'no-restricted-imports'],
  [
    'lib/reports importing next',
    'lib/reports/wall.ts',
    "import { NextResponse } from 'next/server';\nexport const a = NextResponse;\n",
    'no-restricted-imports',
  ],
  [
    'lib/validation importing a node: module',
    'lib/validation/wall.ts',
    "import { readFileSync } from 'node:fs';\nexport const a = readFileSync;\n",
    'no-restricted-imports',
  ],
  ['lib/contracts calling fetch', 'lib/contracts/wall.ts', "export const a = () => fetch('/api/me');\n", 'no-restricted-globals'],
  ['a component calling fetch itself', 'components/x/wall.tsx', "export const a = () => fetch('/api/me');\n", 'no-restricted-globals'],
  [
    'a route handler calling a query module instead of a service',
    'app/api/wall/route.ts',
    "import { listFlags } from '@/lib/server/queries/flags';\nexport const a = listFlags;\n",
    'no-restricted-imports',
  ],
  [
    'a handler building a query',
    'app/api/wall/route.ts',
    "import { db } from '@/lib/server/db';\nexport const a = () => db()('users').first();\n",
    'no-restricted-syntax',
  ],
  [
    'a service building a query on a connection it named database',
    'lib/server/services/wall.ts',
    "import type { Db } from '@/lib/server/db';\nexport const a = (database: Db) => database('block_rows').first();\n",
    'no-restricted-syntax',
  ],
  [
    'a service building a query in a transaction',
    'lib/server/services/wall.ts',
    "import type { Db } from '@/lib/server/db';\nexport const a = (trx: Db) => trx('flags').pluck('id');\n",
    'no-restricted-syntax',
  ],
  [
    'raw SQL outside queries',
    'lib/server/services/wall.ts',
    "import { db } from '@/lib/server/db';\nexport const a = () => db().raw('select 1');\n",
    'no-restricted-syntax',
  ],
];

describe('lint walls', () => {
  it.each(cases)('refuses %s', async (_name, file, code, rule) => {
    expect((await messagesFor(file, code)).some((m) => m.startsWith(`${rule}:`))).toBe(true);
  });

  it('lets the same query builder call pass inside lib/server/queries', async () => {
    const code = "import type { Db } from '@/lib/server/db';\nexport const a = (db: Db) => db('users').first();\n";
    expect(await messagesFor('lib/server/queries/wall.ts', code)).toEqual([]);
  });

  it('lets a component import a contract type', async () => {
    const code = "import type { FlagView } from '@/lib/contracts/flags';\nexport type A = FlagView;\n";
    expect(await messagesFor('components/x/wall.tsx', code)).toEqual([]);
  });
});
