// Bud load against the row it fills: a target that puts far more buds on each foot of row than the
// published range is more likely a wrong weight or formula than a vine that can carry it.
import { requireNonNegative, requirePositive } from './check';
import { M_PER_FT } from './units';
import { resolveSettings, type SettingsOverride } from './settings';

export interface BudLoadCheck {
  /** Buds per vine over the vine's share of row (its vine spacing). */
  budsPerM: number;
  budsPerFt: number;
  /** The published range for this vine spacing, in buds per vine (rounded to whole buds). */
  rangePerVine: { min: number; max: number };
  reading: 'under' | 'within' | 'over';
}

/**
 * Buds per vine read against settings.budLoad (Ohio State, "2023 Grape Pruning Primer": "approximately
 * 4-6 buds per foot of vine spacing (e.g., if the vine spacing is 5-8', retain 20-50 buds per vine)").
 * 20 + 20 at 4 lb gives 80 buds: 16 per foot at 5 ft spacing, well over 6.
 */
export function checkBudLoad(budsPerVine: number, vineSpacingM: number, settings?: SettingsOverride): BudLoadCheck {
  requireNonNegative('budsPerVine', budsPerVine);
  requirePositive('vineSpacingM', vineSpacingM);
  const { minBudsPerFt, maxBudsPerFt } = resolveSettings(settings).budLoad;
  const spacingFt = vineSpacingM / M_PER_FT;
  const budsPerFt = budsPerVine / spacingFt;
  return {
    budsPerM: budsPerVine / vineSpacingM,
    budsPerFt,
    rangePerVine: { min: Math.round(minBudsPerFt * spacingFt), max: Math.round(maxBudsPerFt * spacingFt) },
    // A little slack keeps 6.0000001 buds/ft from a metric round trip inside the range.
    reading: budsPerFt > maxBudsPerFt + 1e-9 ? 'over' : budsPerFt < minBudsPerFt - 1e-9 ? 'under' : 'within',
  };
}
