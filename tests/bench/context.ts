import type { Knex } from 'knex';

export interface BenchContext {
  db: Knex;
  appUrl: string;
  env: NodeJS.ProcessEnv;
  /** The Next.js build folder, for size measurements. */
  distDir: string;
  /** Prints one figure line, e.g. "grid route p95 84 ms (target < 150 ms) ratio 1.9 to bare SQL". */
  report(line: string): void;
  /** `npm run bench -- --scale=full`: the full-scale benches make an estate of the size DESIGN.md promises. */
  scale: 'small' | 'full';
}

export function percentile(sortedMs: number[], p: number) {
  const i = Math.min(sortedMs.length - 1, Math.ceil((p / 100) * sortedMs.length) - 1);
  return sortedMs[Math.max(0, i)]!;
}

export function median(values: number[]) {
  return percentile(
    [...values].sort((a, b) => a - b),
    50,
  );
}
