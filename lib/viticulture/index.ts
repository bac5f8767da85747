// The trade calculations, as the rest of Vineward imports them. Pure functions: no I/O, no clock.
export { MM_PER_IN, M_PER_FT, KG_PER_LB, SQ_FT_PER_ACRE, SQ_M_PER_HA, SQ_M_PER_ACRE } from './units';
export { inToMm, mmToIn, lbToKg, kgToLb, ftToM, mToFt, acToHa, haToAc } from './units';
export { vinesPerAcre, vinesPerHectare, vinesPerArea, type AreaUnit } from './spacing';
export { BALANCED_PRUNING_FORMULAS, GRAPE_TYPES, balancedPruningBuds, type BalancedPruningFormula, type GrapeType, type WeightUnit } from './pruning';
export {
  CANE_REASON_CODES,
  assessCane,
  caneReasonCode,
  recommendedBudsPerCane,
  type CaneAssessment,
  type CaneInput,
  type CaneReasonCode,
  type CaneVerdict,
} from './canes';
export { PLAN_NOTE_CODES, planVine, type PlanNoteCode, type TrainingSystem, type VinePlan, type VinePlanInput } from './plan';
export { budbreakPercent, isWeakBudbreak, primaryBudKillPercent, budInjuryAdjustment, type BudInjuryAdjustment, type BudInjuryAdvice } from './budbreak';
export { normalQuantile, zForConfidence, wilsonInterval, coefficientOfVariationPercent, type ProportionInterval } from './stats';
export { checkBudLoad, type BudLoadCheck } from './budload';
export {
  sampleSizeForProportion,
  sampleSizeForMean,
  detectionSampleSize,
  samplingPlan,
  type BlockLayout,
  type SamplingOptions,
  type VineAddress,
} from './sampling';
export {
  SHORT_TON_KG,
  RAVAZ_PRESETS,
  RAVAZ_TARGETS,
  cropLoadTargetKg,
  harvestClusterWeightG,
  ravazRangeFor,
  isConcordType,
  estimateCropKg,
  estimateCrop,
  cropShortTonsPerAcre,
  cropTonnesPerHa,
  shortTonsPerAcreToTonnesPerHa,
  ravazIndex,
  readRavaz,
  type CropInput,
  type RavazReading,
} from './crop';
export { estimatePruningLabour, type LabourEstimate, type LabourInput } from './labour';
export { SEVERITIES, budDeviationPercent, observationSeverity, pruningCheckBuds, type Severity } from './severity';
export {
  DEFAULT_SETTINGS,
  layerSettings,
  mergeSettings,
  overlaySettings,
  overriddenKeys,
  SETTING_KEYS,
  SETTINGS_META,
  settingValue,
  type BudRange,
  type LayeredSettings,
  type SettingKey,
  type SettingLevel,
  type SettingMeta,
  type SettingsOverride,
  type SettingValue,
  type ViticultureSettings,
} from './settings';
export * from './observations';
