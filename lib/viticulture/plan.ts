// A pruning plan for one vine: which canes to keep, how many buds on each, and the renewal spurs.
import { requireOneOf, requirePositive } from './check';
import { assessCane, recommendedBudsPerCane, type CaneInput, type CaneVerdict } from './canes';
import { balancedPruningBuds, type BalancedPruningFormula, type WeightUnit } from './pruning';
import { resolveSettings, type BudRange, type SettingsOverride, type ViticultureSettings } from './settings';

export type TrainingSystem = 'cane' | 'spur';

export interface VinePlanInput {
  trainingSystem: TrainingSystem;
  canes: readonly CaneInput[];
  /** One-year-old prunings of this vine (last winter's, or weighed now); sets a balanced-pruning target. */
  pruningWeight?: number;
  /** Unit of pruningWeight; default 'lb'. */
  weightUnit?: WeightUnit;
  /** Default: settings.pruning.formula (vinifera 20 + 20 unless the block says otherwise). */
  formula?: BalancedPruningFormula;
  /**
   * Length of cordon the vine's spurs sit on, where known (a bilateral cordon fills the vine
   * spacing). Spur plans keep no more than one spur per `plan.minSpurSpacingMm` of it.
   */
  cordonLengthM?: number;
  settings?: SettingsOverride;
}

export interface VinePlan {
  /** Indexes into `canes`, best first. In a spur system each kept cane is cut back to a spur. */
  keep: number[];
  /** Buds to leave on each kept cane (or spur), parallel to `keep`. */
  budsPerCane: number[];
  renewalSpurs: number;
  budsPerRenewalSpur: number;
  totalBuds: number;
  /** Balanced-pruning target when a pruning weight was given, else null. */
  targetBuds: number | null;
  /** "code: message" strings, codes from PLAN_NOTE_CODES. */
  notes: string[];
}

export const PLAN_NOTE_CODES = ['no-usable-canes', 'fewer-canes-than-wanted', 'second-choice-canes', 'below-target', 'above-target', 'cordon-full'] as const;
export type PlanNoteCode = (typeof PLAN_NOTE_CODES)[number];

const VERDICT_RANK: Record<CaneVerdict, number> = { 'fruit-cane': 0, 'if-nothing-better': 1, remove: 2 };

/**
 * Policy:
 * - Canes judged 'remove' are never kept. The rest are ranked fruit canes first, then by closeness of
 *   base diameter to `canes.idealMm` (3/8 in), then by input order.
 * - Cane system, no target: the best `plan.canesPerVine` canes (2), each with the middle of its
 *   recommendedBudsPerCane range, plus `renewalSpursPerCane` renewal spurs of two buds per kept cane
 *   (rounded up over the vine).
 * - Cane system with a balanced-pruning target (renewal-spur buds count toward it, as every retained
 *   count bud does): try 1 to `maxCanesPerVine` canes and keep the number whose bud range (each cane
 *   within its recommended range, plus spurs) comes nearest the target, preferring the default cane
 *   count and then fewer canes on ties. Buds are then spread to meet the target as closely as those
 *   ranges allow, extra buds going to the best canes first.
 * - Spur system: every kept cane becomes a fruiting spur of `budsPerSpur` (2) buds, and spurs renew
 *   themselves, so there are no separate renewal spurs. Without a target keep `spursPerVine`; with one,
 *   keep ⌊target / budsPerSpur⌋ spurs (so an odd target is met, 41 as 19 two-bud spurs and one of
 *   three, never overshot to 42), lengthening spurs up to `maxBudsPerSpur` if canes run short. With
 *   `cordonLengthM`, spurs are capped at one per `minSpurSpacingMm` of cordon and lengthened instead.
 */
export function planVine(input: VinePlanInput): VinePlan {
  requireOneOf('trainingSystem', input.trainingSystem, ['cane', 'spur']);
  if (input.cordonLengthM !== undefined) requirePositive('cordonLengthM', input.cordonLengthM);
  const s = resolveSettings(input.settings);
  const cordonSpurs = input.cordonLengthM === undefined ? Infinity : Math.max(1, Math.floor((input.cordonLengthM * 1000) / s.plan.minSpurSpacingMm + 1e-9));
  const targetBuds =
    input.pruningWeight === undefined ? null : balancedPruningBuds(input.pruningWeight, input.formula ?? s.pruning.formula, input.weightUnit ?? 'lb');

  const ranked = input.canes
    .map((cane, index) => ({ index, cane, rank: VERDICT_RANK[assessCane(cane, s).verdict] }))
    .filter((c) => c.rank < VERDICT_RANK.remove)
    .sort(
      (a, b) => a.rank - b.rank || Math.abs(a.cane.baseDiameterMm - s.canes.idealMm) - Math.abs(b.cane.baseDiameterMm - s.canes.idealMm) || a.index - b.index,
    );

  const plan =
    input.trainingSystem === 'cane'
      ? planCanes(
          ranked.map((c) => c.cane),
          targetBuds,
          s,
        )
      : planSpurs(Math.min(ranked.length, cordonSpurs), targetBuds, s);
  const kept = ranked.slice(0, plan.budsPerCane.length);
  const totalBuds = plan.budsPerCane.reduce((a, b) => a + b, 0) + plan.renewalSpurs * s.plan.budsPerRenewalSpur;

  const notes: string[] = [];
  const cordonFull = input.trainingSystem === 'spur' && ranked.length > cordonSpurs && plan.wanted > cordonSpurs;
  if (ranked.length === 0) notes.push('no-usable-canes: every cane was judged one to remove');
  else if (cordonFull) {
    notes.push(`cordon-full: ${cordonSpurs} spurs fit ${input.cordonLengthM} m of cordon at one per ${s.plan.minSpurSpacingMm} mm; ${plan.wanted} wanted`);
  } else if (kept.length < plan.wanted) {
    notes.push(`fewer-canes-than-wanted: ${kept.length} usable for ${plan.wanted} wanted`);
  }
  if (kept.some((c) => c.rank > 0)) notes.push('second-choice-canes: a cane kept only because nothing better was there');
  if (targetBuds !== null && totalBuds < targetBuds) {
    notes.push(`below-target: ${totalBuds} buds for a target of ${targetBuds}`);
  } else if (targetBuds !== null && totalBuds > targetBuds) {
    notes.push(`above-target: ${totalBuds} buds for a target of ${targetBuds}`);
  }

  return {
    keep: kept.map((c) => c.index),
    budsPerCane: plan.budsPerCane,
    renewalSpurs: plan.renewalSpurs,
    budsPerRenewalSpur: input.trainingSystem === 'cane' ? s.plan.budsPerRenewalSpur : 0,
    totalBuds,
    targetBuds,
    notes,
  };
}

interface Allocation {
  budsPerCane: number[];
  renewalSpurs: number;
  /** Canes (or spurs) the policy asked for, before running out of usable ones. */
  wanted: number;
}

function planCanes(canes: CaneInput[], target: number | null, s: ViticultureSettings): Allocation {
  const ranges = canes.map((cane) => recommendedBudsPerCane(cane.baseDiameterMm, s));
  const spursFor = (k: number): number => Math.max(0, Math.ceil(k * s.plan.renewalSpursPerCane - 1e-9));
  const defaultCount = Math.min(s.plan.canesPerVine, canes.length);

  if (target === null) {
    const budsPerCane = ranges.slice(0, defaultCount).map((r) => Math.floor((r.min + r.max) / 2 + 0.5));
    return { budsPerCane, renewalSpurs: spursFor(defaultCount), wanted: s.plan.canesPerVine };
  }

  let best = { k: 0, distance: Infinity };
  for (let k = 1; k <= Math.min(s.plan.maxCanesPerVine, canes.length); k++) {
    const spurBuds = spursFor(k) * s.plan.budsPerRenewalSpur;
    const low = sum(ranges.slice(0, k).map((r) => r.min)) + spurBuds;
    const high = sum(ranges.slice(0, k).map((r) => r.max)) + spurBuds;
    const distance = target < low ? low - target : target > high ? target - high : 0;
    const better = distance < best.distance || (distance === best.distance && Math.abs(k - defaultCount) < Math.abs(best.k - defaultCount));
    if (better) best = { k, distance };
  }
  const k = best.k;
  const budsPerCane = spread(target - spursFor(k) * s.plan.budsPerRenewalSpur, ranges.slice(0, k));
  return { budsPerCane, renewalSpurs: spursFor(k), wanted: k };
}

function planSpurs(usable: number, target: number | null, s: ViticultureSettings): Allocation {
  const { budsPerSpur, maxBudsPerSpur, spursPerVine } = s.plan;
  if (target === null) {
    const k = Math.min(spursPerVine, usable);
    return { budsPerCane: Array<number>(k).fill(budsPerSpur), renewalSpurs: 0, wanted: spursPerVine };
  }
  const wanted = Math.max(1, Math.floor(target / budsPerSpur));
  const k = Math.min(wanted, usable);
  const budsPerCane = spread(target, Array<BudRange>(k).fill({ min: budsPerSpur, max: maxBudsPerSpur }));
  return { budsPerCane, renewalSpurs: 0, wanted };
}

/** `budget` buds over canes, each within its range; extra buds go round the canes, best first. */
function spread(budget: number, ranges: BudRange[]): number[] {
  const buds = ranges.map((r) => r.min);
  let left = budget - sum(buds);
  while (left > 0) {
    let added = false;
    for (let i = 0; i < buds.length && left > 0; i++) {
      if (buds[i]! < ranges[i]!.max) {
        buds[i]!++;
        left--;
        added = true;
      }
    }
    if (!added) break;
  }
  return buds;
}

function sum(values: number[]): number {
  return values.reduce((a, b) => a + b, 0);
}
