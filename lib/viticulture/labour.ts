import { requireNonNegative } from './check';

export interface LabourInput {
  vines: number;
  minutesPerVine: number;
  /** Cost of one hour of work, in whatever currency the block uses. */
  hourlyCost: number;
}

export interface LabourEstimate {
  hours: number;
  cost: number;
}

/**
 * Pruning hours = vines × minutes per vine / 60, cost = hours × hourly cost. Every minute spent per vine
 * costs 13.45 h on an acre of 807 vines (6 × 9 ft), which Martinson & Vanden Heuvel (Cornell) round to
 * "13.5 hours labor per acre".
 */
export function estimatePruningLabour(input: LabourInput): LabourEstimate {
  const vines = requireNonNegative('vines', input.vines);
  const minutes = requireNonNegative('minutesPerVine', input.minutesPerVine);
  const hourlyCost = requireNonNegative('hourlyCost', input.hourlyCost);
  const hours = (vines * minutes) / 60;
  return { hours, cost: hours * hourlyCost };
}
