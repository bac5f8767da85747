// Balanced pruning: the "X + Y" rules. X buds are kept for the first unit (pound) of one-year-old
// prunings and Y more for each further unit, so next year's crop follows this year's vine size.
import { requireNonNegative, requireOneOf } from './check';
import { KG_PER_LB } from './units';

export type WeightUnit = 'lb' | 'kg';

export interface BalancedPruningFormula {
  readonly firstUnitBuds: number;
  readonly perAdditionalUnitBuds: number;
  /** The unit the formula was published in; every published one is per pound. */
  readonly unit: WeightUnit;
}

export type GrapeType =
  | 'concord'
  | 'niagara'
  | 'catawba'
  | 'delaware'
  | 'hybrid-small-cluster'
  | 'hybrid-large-cluster'
  | 'vinifera'
  | 'american'
  | 'french-hybrid'
  | 'new-hybrid'
  | 'seedless-table';

const perPound = (firstUnitBuds: number, perAdditionalUnitBuds: number): BalancedPruningFormula =>
  Object.freeze({ firstUnitBuds, perAdditionalUnitBuds, unit: 'lb' as const });

export const BALANCED_PRUNING_FORMULAS: Readonly<Record<GrapeType, BalancedPruningFormula>> = Object.freeze({
  // T. Bates, Cornell LERGP, "Vine Size, Pruning Severity, and Vine Balance" (30 + 10); also the
  // "American 30 + 10" row of Ohio State's "2023 Grape Pruning Primer" (M. Smith), Table 1.
  concord: perPound(30, 10),
  // From memory (classic Cornell / Penn State table); not found in a source.
  niagara: perPound(25, 10),
  // Missouri State Fruit Experiment Station, "Grape pruning begins" (8 Nov 2012): "Using the 30 + 10
  // pruning formula recommended for Catwaba [sic]"; their 2009 post's "about 45 buds" at 2.55 lb
  // (45.5 under 30 + 10, 40.5 under 25 + 10) agrees. The 25 + 10 once here was from memory.
  catawba: perPound(30, 10),
  // From memory.
  delaware: perPound(20, 10),
  // Ohio State 2023 primer gives "French Hybrids 20 + 10"; the small/large-cluster split is from memory.
  'hybrid-small-cluster': perPound(20, 10),
  // From memory; large-clustered hybrids also need cluster thinning (Ohio State 2023 primer).
  'hybrid-large-cluster': perPound(10, 10),
  // Ohio State 2023 primer, Table 1: "Vinifera 20 + 20".
  vinifera: perPound(20, 20),
  // The remaining rows of the same Ohio State 2023 table ("adapted from Midwest Grape Production Guide").
  american: perPound(30, 10),
  'french-hybrid': perPound(20, 10),
  'new-hybrid': perPound(20, 20),
  'seedless-table': perPound(30, 10),
});

export const GRAPE_TYPES = Object.freeze(Object.keys(BALANCED_PRUNING_FORMULAS)) as readonly GrapeType[];

export function validateFormula(formula: BalancedPruningFormula): BalancedPruningFormula {
  if (formula === null || typeof formula !== 'object') {
    throw new RangeError('formula must be an object like { firstUnitBuds, perAdditionalUnitBuds, unit }');
  }
  requireNonNegative('formula.firstUnitBuds', formula.firstUnitBuds);
  requireNonNegative('formula.perAdditionalUnitBuds', formula.perAdditionalUnitBuds);
  requireOneOf('formula.unit', formula.unit, ['lb', 'kg']);
  return formula;
}

// Absorbs float noise and weights quoted to seven figures after a unit conversion (1.1339809 kg is
// 2.5 lb to the gram and must give the 45 buds of 2.5 lb, not 44).
const ROUNDING_SLACK_BUDS = 1e-4;

/**
 * Buds to retain for a vine whose one-year-old prunings weigh `pruningWeight` (in `unit`, converted
 * to the formula's unit): `firstUnitBuds + perAdditionalUnitBuds × (weight − 1)`.
 *
 * Under one unit of prunings the sources say nothing. Such a vine is weak, and granting it the full
 * first-unit allowance would load it like a vine of one full unit; instead the allowance is scaled
 * down in proportion (`firstUnitBuds × weight`). That keeps the first unit's buds per unit of wood,
 * meets the published formula exactly at one unit, and so more prunings never give fewer buds.
 *
 * The result is rounded down to a whole bud: published examples round down (Missouri State gives
 * "about 45" for 45.5), and the error then falls on the side of a lighter crop.
 */
export function balancedPruningBuds(pruningWeight: number, formula: BalancedPruningFormula, unit: WeightUnit = 'lb'): number {
  requireNonNegative('pruningWeight', pruningWeight);
  validateFormula(formula);
  requireOneOf('unit', unit, ['lb', 'kg']);
  const weight = convertWeight(pruningWeight, unit, formula.unit);
  const exact = weight < 1 ? formula.firstUnitBuds * weight : formula.firstUnitBuds + formula.perAdditionalUnitBuds * (weight - 1);
  return Math.floor(exact + ROUNDING_SLACK_BUDS);
}

function convertWeight(value: number, from: WeightUnit, to: WeightUnit): number {
  if (from === to) return value;
  return from === 'kg' ? value / KG_PER_LB : value * KG_PER_LB;
}
