import type { BlockProgress } from './progress';

/** What the crews recorded in a season, for the season report's labour section beside the estimate. */
export interface RecordedLabour {
  pruningHours: number;
  pruningCost: number | null;
  pruningVines: number;
  /** Every pass together (pre-pruning, pruning, brush, tying, shoot thinning). */
  allHours: number;
  allCost: number | null;
}

export function recordedLabour(progress: BlockProgress): RecordedLabour {
  const pruning = progress.passes.find((p) => p.pass === 'pruning')!;
  const sum = (values: (number | null)[]) => values.reduce<number | null>((s, v) => (s === null || v === null ? null : s + v), 0);
  return {
    pruningHours: pruning.personHours,
    pruningCost: pruning.costToDate,
    pruningVines: pruning.vinesDone,
    allHours: Math.round(progress.passes.reduce((s, p) => s + p.personHours, 0) * 100) / 100,
    allCost: sum(progress.passes.map((p) => p.costToDate)),
  };
}
