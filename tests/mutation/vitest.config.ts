/**
 * The unit project with one default in DEFAULT_SETTINGS moved by one step, for
 * scripts/mutate-settings.ts: MUTATE names the leaf (`canes.bullAboveMm`, `budsPerCane.thin.min`)
 * and MUTATE_STEP the amount. The change is made to the module's text as it is loaded, so the file
 * on disk is never touched.
 */
import path from 'node:path';
import { defineConfig } from 'vitest/config';

const root = path.resolve(__dirname, '../..');
const target = path.join(root, 'lib/viticulture/settings.ts');
const leaf = process.env.MUTATE ?? '';
const step = Number(process.env.MUTATE_STEP);
const OPEN = 'export const DEFAULT_SETTINGS: ViticultureSettings = deepFreeze<ViticultureSettings>({';

export default defineConfig({
  resolve: { alias: { '@': root, 'server-only': path.join(root, 'tests/fixtures/server-only.ts') } },
  plugins: [
    {
      name: 'mutate-default',
      enforce: 'pre',
      transform(code, id) {
        if (id.split('?')[0] !== target) return null;
        const start = code.indexOf(OPEN);
        const end = code.indexOf('\n});\n', start);
        if (start < 0 || end < 0 || !leaf || !Number.isFinite(step)) throw new Error('mutation: DEFAULT_SETTINGS not found, or MUTATE/MUTATE_STEP unset');
        const mutate = `
function __mutate<T>(value: T): T {
  const copy = JSON.parse(JSON.stringify(value));
  const keys = ${JSON.stringify(leaf.split('.'))};
  let at = copy;
  for (const k of keys.slice(0, -1)) at = at[k];
  if (typeof at[keys[keys.length - 1]] !== 'number') throw new Error('mutation: ${leaf} is not a number');
  at[keys[keys.length - 1]] += ${step};
  return copy;
}
`;
        return `${code.slice(0, start)}${OPEN.replace('({', '(__mutate({')}${code.slice(start + OPEN.length, end)}\n}));\n${code.slice(end + 5)}${mutate}`;
      },
    },
  ],
  // The property tests are left out: slow, and a default they alone would notice counts as survived.
  test: {
    environment: 'node',
    pool: 'forks',
    maxWorkers: 2,
    include: ['tests/unit/viticulture/**/*.test.ts'],
    exclude: ['tests/unit/viticulture/properties.test.ts'],
    testTimeout: 20_000,
  },
});
