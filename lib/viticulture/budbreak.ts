// Spring checks on the buds left at pruning: how many pushed, and winter kill of primary buds.
import { requireCount, requireNonNegative, requirePercent } from './check';
import { resolveSettings, type SettingsOverride } from './settings';

/** Shoots that pushed from count buds as a percentage of the buds retained (0–100). */
export function budbreakPercent(budsRetained: number, budsPushed: number): number {
  return share('budsRetained', budsRetained, 'budsPushed', budsPushed);
}

/**
 * Budbreak under `settings.budbreak.weakBelowPercent`. No published threshold exists, so the default
 * is common practice, no source; a block can set its own.
 */
export function isWeakBudbreak(budsRetained: number, budsPushed: number, settings?: SettingsOverride): boolean {
  return budbreakPercent(budsRetained, budsPushed) < resolveSettings(settings).budbreak.weakBelowPercent;
}

/** Dead primary buds as a percentage of the buds cut open (0–100). */
export function primaryBudKillPercent(budsCut: number, primariesDead: number): number {
  return share('budsCut', budsCut, 'primariesDead', primariesDead);
}

export type BudInjuryAdvice = 'prune-normally' | 'leave-extra' | 'minimal-pruning';

export interface BudInjuryAdjustment {
  buds: number;
  advice: BudInjuryAdvice;
}

/**
 * The linear rule of Cornell's Northern New York grape programme ("Evaluating bud injury and adjusting
 * pruning", NNY Grape Update, 28 Feb 2014): under 20% primary bud kill leave no extra buds; from 20%
 * to 80% leave that percentage more (35% kill on a 40-bud target → 54). The target is raised by the
 * kill, not divided by the surviving share: 40 / 0.65 would give 62, which is a different rule.
 *
 * Above 80% the advice is minimal (or delayed) pruning, and `buds` is the 80% figure: the least to
 * leave if the vine is pruned anyway, since the rule publishes no band beyond it. Bands are settings
 * (`budInjury`); buds are rounded to whole buds, half up.
 */
export function budInjuryAdjustment(
  targetBuds: number,
  primaryBudKillPercent: number,
  settings?: SettingsOverride,
): BudInjuryAdjustment {
  requireNonNegative('targetBuds', targetBuds);
  requirePercent('primaryBudKillPercent', primaryBudKillPercent);
  const { extraFromPercent, minimalAbovePercent } = resolveSettings(settings).budInjury;
  if (primaryBudKillPercent < extraFromPercent) return { buds: roundHalfUp(targetBuds), advice: 'prune-normally' };
  const extraPercent = Math.min(primaryBudKillPercent, minimalAbovePercent);
  const buds = roundHalfUp((targetBuds * (100 + extraPercent)) / 100);
  return { buds, advice: primaryBudKillPercent > minimalAbovePercent ? 'minimal-pruning' : 'leave-extra' };
}

// Multiplying before dividing keeps whole-number cases exact, so 30 × 135 / 100 is 40.5 and rounds up.
function roundHalfUp(value: number): number {
  return Math.floor(value + 0.5 + 1e-9);
}

function share(totalName: string, total: number, partName: string, part: number): number {
  requireCount(totalName, total);
  requireCount(partName, part);
  if (total === 0) throw new RangeError(`${totalName} must be at least 1 to give a percentage`);
  if (part > total) throw new RangeError(`${partName} (${part}) cannot exceed ${totalName} (${total})`);
  return (part / total) * 100;
}
