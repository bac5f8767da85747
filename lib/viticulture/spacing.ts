import { requireOneOf, requirePositive } from './check';
import { SQ_FT_PER_ACRE, SQ_M_PER_HA } from './units';

export type AreaUnit = 'acre' | 'ha';

/**
 * Vines per acre = 43 560 ft² / (row spacing × vine spacing), unrounded. Published tables round
 * to the nearest vine (BC Wine Grape Council: 6 × 9 ft → 807, where the raw value is 806.67);
 * round for display, not here, so totals over many blocks do not drift.
 */
export function vinesPerAcre(rowSpacingFt: number, vineSpacingFt: number): number {
  return SQ_FT_PER_ACRE / (requirePositive('rowSpacingFt', rowSpacingFt) * requirePositive('vineSpacingFt', vineSpacingFt));
}

/** Vines per hectare = 10 000 m² / (row spacing × vine spacing), unrounded. */
export function vinesPerHectare(rowSpacingM: number, vineSpacingM: number): number {
  return SQ_M_PER_HA / (requirePositive('rowSpacingM', rowSpacingM) * requirePositive('vineSpacingM', vineSpacingM));
}

/** Spacings in feet give vines per acre; spacings in metres give vines per hectare. */
export function vinesPerArea(rowSpacing: number, vineSpacing: number, unit: AreaUnit): number {
  requireOneOf('unit', unit, ['acre', 'ha']);
  return unit === 'acre' ? vinesPerAcre(rowSpacing, vineSpacing) : vinesPerHectare(rowSpacing, vineSpacing);
}
