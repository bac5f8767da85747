// Crop estimates and vine balance (Ravaz index).
import { requireFraction, requireNonNegative, requirePositive } from './check';
import type { GrapeType } from './pruning';
import { DEFAULT_SETTINGS, resolveSettings, type SettingsOverride } from './settings';
import { KG_PER_LB, acToHa } from './units';

/** 2000 lb, exactly 907.18474 kg. */
export const SHORT_TON_KG = 2000 * KG_PER_LB;

export type CropInput =
  | {
      vines: number;
      budsPerVine: number;
      /** Share of retained buds that pushed a shoot, 0–1. Extra shoots per node belong in clustersPerShoot. */
      budbreakFraction: number;
      clustersPerShoot: number;
      clusterWeightG: number;
      clustersPerVine?: never;
    }
  | {
      vines: number;
      /** Clusters counted on the vines (Dami's NC), in place of buds × budbreak × clusters per shoot. */
      clustersPerVine: number;
      clusterWeightG: number;
      budsPerVine?: never;
      budbreakFraction?: never;
      clustersPerShoot?: never;
    };

/**
 * Block crop in kilograms: vines × buds per vine × budbreak × clusters per shoot × cluster weight.
 * It is Dami's "PY = (ANV × NC × CW) / 2000" (OSU, "How to Estimate Grape Yields") with the clusters
 * per vine built from their components, as AWRI Technical Review 259 (Dixon, 2022) lists them: buds
 * retained, % bud burst, bunches per shoot. Bunch number drives about 60% of the year-to-year
 * variation, so the inputs worth measuring carefully are the counts.
 */
export function estimateCropKg(input: CropInput): number {
  const vines = requireNonNegative('vines', input.vines);
  const clusterWeightG = requireNonNegative('clusterWeightG', input.clusterWeightG);
  if (input.clustersPerVine !== undefined) {
    return (vines * requireNonNegative('clustersPerVine', input.clustersPerVine) * clusterWeightG) / 1000;
  }
  const buds = requireNonNegative('budsPerVine', input.budsPerVine);
  const budbreak = requireFraction('budbreakFraction', input.budbreakFraction);
  const clusters = requireNonNegative('clustersPerShoot', input.clustersPerShoot);
  return (vines * buds * budbreak * clusters * clusterWeightG) / 1000;
}

/**
 * Harvest cluster weight from clusters weighed at lag phase: lag-phase weight × multiplier
 * (settings.crop.lagPhaseMultiplier, 2 by default). J. Fiola, University of Maryland Extension, "Crop
 * Estimation": lag phase is "typically about 55 days after first bloom" and "cluster weights will
 * double from lag phase to harvest"; "this multiplier is not a fixed number", so a block that has its
 * own (harvest weight ÷ lag-phase weight of past years) should set it.
 */
export function harvestClusterWeightG(lagPhaseClusterWeightG: number, settings?: SettingsOverride): number {
  return requireNonNegative('lagPhaseClusterWeightG', lagPhaseClusterWeightG) * resolveSettings(settings).crop.lagPhaseMultiplier;
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
 * LERGP, "Vine Size: Magic Number 15" ("a Ravaz Index > 20 ... overcropped", "< 10 ... undercropped").
 */
export const RAVAZ_PRESETS = Object.freeze({
  vinifera: DEFAULT_SETTINGS.ravaz,
  concord: DEFAULT_SETTINGS.ravazAmerican,
});

/** Ravaz targets with a published single value: Concord 15 (Bates, "Vine Size: Magic Number 15"). */
export const RAVAZ_TARGETS = Object.freeze({ concord: 15 });

/**
 * The Ravaz range for a grape type: Concord and the Concord-type "American" row read against
 * `settings.ravazAmerican` (Bates's 10–20 unless the block or organisation sets its own); every other
 * type against `settings.ravaz` (vinifera 5–10). No published range was found for Niagara, Catawba,
 * Delaware or the hybrids: a block of those sets its own range where its adviser has one.
 */
/** Concord and Ohio State's Concord-type "American" row: the grapes Bates's range is for. */
export const isConcordType = (grapeType: GrapeType | null | undefined) => grapeType === 'concord' || grapeType === 'american';

export function ravazRangeFor(grapeType: GrapeType | null | undefined, settings?: SettingsOverride): { underBelow: number; overAbove: number } {
  const resolved = resolveSettings(settings);
  return { ...(isConcordType(grapeType) ? resolved.ravazAmerican : resolved.ravaz) };
}

/**
 * The crop a vine of this size can ripen: Ravaz index × its dormant pruning weight (the index is
 * yield over pruning weight, so a target index fixes the yield). A Concord vine with 1.5 kg of
 * prunings at Bates's 15 should carry 22.5 kg.
 */
export function cropLoadTargetKg(pruningWeightKg: number, ravazTarget: number): number {
  return requireNonNegative('pruningWeightKg', pruningWeightKg) * requirePositive('ravazTarget', ravazTarget);
}

/** Reads an index against the range in `settings.ravaz`; both ends count as balanced. */
export function readRavaz(index: number, settings?: SettingsOverride): RavazReading {
  requireNonNegative('index', index);
  const { underBelow, overAbove } = resolveSettings(settings).ravaz;
  return index < underBelow ? 'under-cropped' : index > overAbove ? 'over-cropped' : 'balanced';
}
