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
  /** Buds to leave; null when the advice is minimal pruning, which is not a bud count. */
  buds: number | null;
  advice: BudInjuryAdvice;
}

/**
 * Next winter's bud target after primary-bud kill, in three bands (settings.budInjury):
 * - under `extraFromPercent` (20%): prune normally ("if <20% of buds are injured, you don't need to
 *   leave extra buds", Cornell NNY Grape Update, 28 Feb 2014);
 * - from there up to `minimalAbovePercent` (50%): Cornell's linear rule, "leave an additional amount
 *   of buds equal to the bud injury" (35% kill on a 40-bud target → 54). The target is raised by the
 *   kill, not divided by the surviving share (40 / 0.65 would give 62, a different rule);
 * - above it: minimal pruning, or pruning delayed until after budbreak, with no bud count (Purdue,
 *   Facts for Fancy Fruit: ">50% bud damage- Minimally prune"; MSU table-grape guide: "greater than
 *   50% ... delay pruning until after bud break"). `buds` is null: no published rule gives one.
 * Buds are rounded to whole buds, half up.
 */
export function budInjuryAdjustment(targetBuds: number, primaryBudKillPercent: number, settings?: SettingsOverride): BudInjuryAdjustment {
  requireNonNegative('targetBuds', targetBuds);
  requirePercent('primaryBudKillPercent', primaryBudKillPercent);
  const { extraFromPercent, minimalAbovePercent } = resolveSettings(settings).budInjury;
  if (primaryBudKillPercent < extraFromPercent) return { buds: roundHalfUp(targetBuds), advice: 'prune-normally' };
  if (primaryBudKillPercent > minimalAbovePercent) return { buds: null, advice: 'minimal-pruning' };
  return { buds: roundHalfUp((targetBuds * (100 + primaryBudKillPercent)) / 100), advice: 'leave-extra' };
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
