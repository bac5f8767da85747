// One severity per observation, 0 (fine) to 3 (urgent): the grid and the reports colour by it.
// 1 means watch, 2 means act this season, 3 means act now. Numeric limits are settings; the
// categorical steps below are the product's own scale (common practice, no source).
import { requireCount, requireNonNegative, requireOneOf, requirePercent, requirePositive } from './check';
import { caneFindings, judge, type CaneVerdict } from './canes';
import { budInjuryAdjustment, budbreakPercent, primaryBudKillPercent } from './budbreak';
import {
  CANE_INJURY_CAUSES,
  EXPOSURES,
  INJURY_SEVERITIES,
  OBSERVATION_KINDS,
  TRUNK_INJURY_CAUSES,
  VINE_STATES,
  type InjurySeverity,
  type ObservationData,
  type ObservationDataMap,
  type ObservationKind,
  type PruningCheckData,
  type VineState,
} from './observations';
import { balancedPruningBuds } from './pruning';
import { resolveSettings, type SettingsOverride, type ViticultureSettings } from './settings';

export type Severity = 0 | 1 | 2 | 3;
export const SEVERITIES: readonly Severity[] = [0, 1, 2, 3];

type Rule<K extends ObservationKind> = (data: ObservationDataMap[K], s: ViticultureSettings) => Severity;

// A cane problem is a pruning decision for next winter, never urgent.
const CANE_SEVERITY: Record<CaneVerdict, Severity> = { 'fruit-cane': 0, 'if-nothing-better': 1, remove: 2 };

const INJURY_STEP: Record<InjurySeverity, Severity> = { light: 1, moderate: 2, severe: 2 };

// A dying vine can still be saved (trunk renewal) or should be diagnosed before it spreads trouble;
// a missing or dead one waits for the replanting season.
const VINE_STATE_SEVERITY: Record<VineState, Severity> = { missing: 2, dead: 2, dying: 3 };

const RULES: { [K in ObservationKind]: Rule<K> } = {
  // The cane's verdict from assessCane: fruit-cane 0, if-nothing-better 1, remove 2.
  'cane-diameter': (d, s) => {
    requirePositive('diameterMm', d.diameterMm);
    const { diameterMm, ...rest } = d;
    return caneSeverity({ ...rest, baseDiameterMm: diameterMm }, s);
  },
  // Same scale; the diameter is optional here, so only what was measured is judged.
  'shade-cane': (d, s) => {
    requireNonNegative('longestInternodeMm', d.longestInternodeMm);
    requireOneOf('exposure', d.exposure, EXPOSURES);
    if (d.diameterMm !== undefined) requirePositive('diameterMm', d.diameterMm);
    return caneSeverity({ longestInternodeMm: d.longestInternodeMm, exposure: d.exposure, colourGood: d.colourGood, baseDiameterMm: d.diameterMm }, s);
  },
  // Weak (settings.budbreak.weakBelowPercent) 1, poor 2, failed 3; no published threshold exists.
  'weak-budbreak': (d, s) => {
    const percent = budbreakPercent(d.budsRetained, d.budsPushed);
    const { weakBelowPercent, poorBelowPercent, failedBelowPercent } = s.budbreak;
    return percent < failedBelowPercent ? 3 : percent < poorBelowPercent ? 2 : percent < weakBelowPercent ? 1 : 0;
  },
  // Any trunk injury is worth watching (1). Moderate, or girdling over trunkInjury.actAbovePercent: 2.
  // Severe, or girdling over urgentAbovePercent (half the circumference), cuts the vine's supply line:
  // 3, renew the trunk. Common practice, no source.
  'trunk-injury': (d, s) => {
    requireOneOf('cause', d.cause, TRUNK_INJURY_CAUSES);
    requireOneOf('severity', d.severity, INJURY_SEVERITIES);
    const girdling = requirePercent('girdlingPercent', d.girdlingPercent);
    if (d.severity === 'severe' || girdling > s.trunkInjury.urgentAbovePercent) return 3;
    if (d.severity === 'moderate' || girdling > s.trunkInjury.actAbovePercent) return 2;
    return 1;
  },
  // Light 1, moderate or severe 2; severe on caneInjury.urgentFromCanes canes or more leaves no good
  // canes to prune to: 3. No canes affected: 0.
  'cane-injury': (d, s) => {
    requireOneOf('cause', d.cause, CANE_INJURY_CAUSES);
    requireOneOf('severity', d.severity, INJURY_SEVERITIES);
    const canes = requireCount('canesAffected', d.canesAffected);
    if (canes === 0) return 0;
    if (d.severity === 'severe' && canes >= s.caneInjury.urgentFromCanes) return 3;
    return INJURY_STEP[d.severity];
  },
  'missing-vine': (d) => VINE_STATE_SEVERITY[requireOneOf('state', d.state, VINE_STATES)],
  // settings.budInjury bands: prune normally 0 (under 20%, Cornell NNY 2014), leave extra buds 2,
  // minimal or delayed pruning 3 (over 50%, Purdue Facts for Fancy Fruit; MSU).
  'bud-injury': (d, s) => {
    const advice = budInjuryAdjustment(0, primaryBudKillPercent(d.budsCut, d.primariesDead), s).advice;
    return advice === 'prune-normally' ? 0 : advice === 'leave-extra' ? 2 : 3;
  },
  // Buds retained (canes × buds per cane + two per renewal spur) against budTarget, or against the
  // balanced-pruning target of pruningWeightKg under settings.pruning.formula. Within
  // pruningRecord.fineWithinPercent of the target 0, then 1, 2 and 3 past watch and act limits.
  // No target: 0, there is nothing to measure against.
  'pruning-record': (d, s) => {
    const retained =
      requireCount('canesKept', d.canesKept) * requireCount('budsPerCane', d.budsPerCane) +
      requireCount('renewalSpurs', d.renewalSpurs) * s.plan.budsPerRenewalSpur;
    const target =
      d.budTarget !== undefined
        ? requireNonNegative('budTarget', d.budTarget)
        : d.pruningWeightKg !== undefined
          ? balancedPruningBuds(d.pruningWeightKg, s.pruning.formula, 'kg')
          : undefined;
    return target === undefined ? 0 : deviationSeverity(retained, target, s);
  },
  // What a pruner left (pruningCheckBuds) against the block's budTarget, on the pruning-record bands.
  // No target on the record: 0; the per-pruner report also compares with the vine's own plan.
  'pruning-check': (d, s) => {
    const retained = pruningCheckBuds(d, s);
    return d.budTarget === undefined ? 0 : deviationSeverity(retained, requireNonNegative('budTarget', d.budTarget), s);
  },
  note: () => 0,
};

function deviationSeverity(retained: number, target: number, s: ViticultureSettings): Severity {
  if (target === 0) return retained === 0 ? 0 : 3;
  const off = Math.abs(budDeviationPercent(retained, target));
  const { fineWithinPercent, watchWithinPercent, actWithinPercent } = s.pruningRecord;
  return off <= fineWithinPercent ? 0 : off <= watchWithinPercent ? 1 : off <= actWithinPercent ? 2 : 3;
}

/** Retained buds off target, in percent of the target: negative when too few were left. */
export function budDeviationPercent(retained: number, target: number): number {
  requireNonNegative('retained', retained);
  requirePositive('target', target);
  return ((retained - target) / target) * 100;
}

/** Buds a checked vine carries: those on its canes or spurs plus its renewal spurs at their bud count. */
export function pruningCheckBuds(d: Omit<PruningCheckData, 'prunedBy'>, settings?: SettingsOverride): number {
  const s = resolveSettings(settings);
  requireCount('canesKept', d.canesKept);
  return requireCount('budsOnCanes', d.budsOnCanes) + requireCount('renewalSpurs', d.renewalSpurs) * s.plan.budsPerRenewalSpur;
}

function caneSeverity(input: Parameters<typeof caneFindings>[0], s: ViticultureSettings): Severity {
  return CANE_SEVERITY[judge(caneFindings(input, s), s).verdict];
}

/** Severity of one observation, 0 (fine) to 3 (urgent). Invalid data throws a RangeError. */
export function observationSeverity<K extends ObservationKind>(kind: K, data: ObservationData<K>, settings?: SettingsOverride): Severity {
  requireOneOf('kind', kind, OBSERVATION_KINDS);
  if (data === null || typeof data !== 'object') throw new RangeError(`data for '${kind}' must be an object`);
  return (RULES[kind] as Rule<K>)(data, resolveSettings(settings));
}
