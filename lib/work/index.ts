// Row work: passes, pace, projection, cost and progress. Pure functions: no I/O, no clock.
export { ROW_WORK_PASSES, PASS_LABELS, isRowWorkPass, type RowWorkPass } from './passes';
export { vinesPerPersonHour, projectedPersonHours, projectFinish } from './pace';
export { PAY_BASES, PAY_CAUTION, workCost, projectedWorkCost, type PayBasis, type PayBasisKind } from './cost';
export {
  buildBlockProgress,
  estimatedPassHours,
  toContract,
  type BlockProgress,
  type LeadCoverage,
  type PassDetail,
  type PassProgress,
  type ProgressBlock,
  type ProgressFacts,
  type RowCoverage,
  type RowState,
} from './progress';
