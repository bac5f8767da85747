// Crop estimates and vine balance (Ravaz index).
import { requireFraction, requireNonNegative, requirePositive } from './check';
import { resolveSettings, type SettingsOverride } from './settings';
import { KG_PER_LB, acToHa } from './units';

/** 2000 lb, exactly 907.18474 kg. */
export const SHORT_TON_KG = 2000 * KG_PER_LB;

export interface CropInput {
  vines: number;
  budsPerVine: number;
  /** Share of retained buds that pushed a shoot, 0–1. Extra shoots per node belong in clustersPerShoot. */
  budbreakFraction: number;
  clustersPerShoot: number;
  clusterWeightG: number;
}

/**
 * Block crop in kilograms: vines × buds per vine × budbreak × clusters per shoot × cluster weight.
 * It is Dami's "PY = (ANV × NC × CW) / 2000" (OSU, "How to Estimate Grape Yields") with the clusters
 * per vine built from their components, as AWRI Technical Review 259 (Dixon, 2022) lists them: buds
 * retained, % bud burst, bunches per shoot. Bunch number drives about 60% of the year-to-year
 * variation, so the inputs worth measuring carefully are the counts.
 */
export function estimateCropKg(input: CropInput): number {
  const vines = requireNonNegative('vines', input.vines);
  const buds = requireNonNegative('budsPerVine', input.budsPerVine);
  const budbreak = requireFraction('budbreakFraction', input.budbreakFraction);
  const clusters = requireNonNegative('clustersPerShoot', input.clustersPerShoot);
  const clusterWeightG = requireNonNegative('clusterWeightG', input.clusterWeightG);
  return (vines * buds * budbreak * clusters * clusterWeightG) / 1000;
}

/** The product brief's name for estimateCropKg. */
export const estimateCrop = estimateCropKg;

/** Crop per area in short tons (2000 lb) per acre, the unit of US extension tables. */
export function cropShortTonsPerAcre(cropKg: number, areaAcres: number): number {
  return requireNonNegative('cropKg', cropKg) / SHORT_TON_KG / requirePositive('areaAcres', areaAcres);
}

/** Crop per area in tonnes per hectare. */
export function cropTonnesPerHa(cropKg: number, areaHa: number): number {
  return requireNonNegative('cropKg', cropKg) / 1000 / requirePositive('areaHa', areaHa);
}

/** 1 short ton/acre = 0.90718474 t / 0.40468564224 ha ≈ 2.2417 t/ha. */
export function shortTonsPerAcreToTonnesPerHa(shortTonsPerAcre: number): number {
  return (requireNonNegative('shortTonsPerAcre', shortTonsPerAcre) * SHORT_TON_KG) / 1000 / acToHa(1);
}

/**
 * Ravaz index: yield over dormant one-year pruning weight, per vine, both in kilograms (any one unit
 * would do; the ratio has none). AJEV's Oakville Cabernet Sauvignon table: 9.8 / 1.30 = 7.5.
 */
export function ravazIndex(yieldKg: number, pruningWeightKg: number): number {
  return requireNonNegative('yieldKg', yieldKg) / requirePositive('pruningWeightKg', pruningWeightKg);
}

export type RavazReading = 'under-cropped' | 'balanced' | 'over-cropped';

/**
 * Target ranges to pass as `{ ravaz: RAVAZ_PRESETS.concord }`. Vinifera 5–10: Wines & Vines, June
 * 2017 ("can range from 5 to 10"), the default. Concord 10–20 around a target of 15: T. Bates, Cornell
 * LERGP, "Vine Size: Magic Number 15".
 */
export const RAVAZ_PRESETS = Object.freeze({
  vinifera: Object.freeze({ underBelow: 5, overAbove: 10 }),
  concord: Object.freeze({ underBelow: 10, overAbove: 20 }),
});

/** Reads an index against the range in `settings.ravaz`; both ends count as balanced. */
export function readRavaz(index: number, settings?: SettingsOverride): RavazReading {
  requireNonNegative('index', index);
  const { underBelow, overAbove } = resolveSettings(settings).ravaz;
  return index < underBelow ? 'under-cropped' : index > overAbove ? 'over-cropped' : 'balanced';
}
