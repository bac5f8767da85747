import { describe, expect, it } from 'vitest';
import {
  RAVAZ_PRESETS,
  RAVAZ_TARGETS,
  SHORT_TON_KG,
  cropLoadTargetKg,
  harvestClusterWeightG,
  ravazRangeFor,
  cropShortTonsPerAcre,
  cropTonnesPerHa,
  estimateCrop,
  estimateCropKg,
  estimatePruningLabour,
  lbToKg,
  ravazIndex,
  readRavaz,
  shortTonsPerAcreToTonnesPerHa,
  vinesPerAcre,
} from '@/lib/viticulture';

describe('estimateCropKg', () => {
  it('matches Dami\'s PY = ANV × NC × CW / 2000 tons per acre (I. Dami, OSU, "How to Estimate Grape Yields") after unit conversion', () => {
    // 807 vines/acre at 6 × 9 ft with 5% missing → 767 bearing vines; 40 clusters of 0.25 lb are
    // illustrative inputs, not published ones.
    const bearing = Math.round(Math.round(vinesPerAcre(9, 6)) * 0.95);
    expect(bearing).toBe(767);
    const dami = (bearing * 40 * 0.25) / 2000;
    const kg = estimateCropKg({ vines: bearing, budsPerVine: 40, budbreakFraction: 1, clustersPerShoot: 1, clusterWeightG: lbToKg(0.25) * 1000 });
    expect(cropShortTonsPerAcre(kg, 1)).toBeCloseTo(dami, 10);
    expect(dami).toBeCloseTo(3.835, 10);
  });

  it('builds clusters per vine from buds retained, % bud burst and bunches per shoot (AWRI Technical Review 259, Dixon 2022)', () => {
    // 30 buds × 0.9 × 1.5 = 40.5 clusters per vine, at 150 g: 6.075 kg per vine.
    expect(estimateCropKg({ vines: 1000, budsPerVine: 30, budbreakFraction: 0.9, clustersPerShoot: 1.5, clusterWeightG: 150 })).toBeCloseTo(6075, 9);
  });

  it("is also exported under the product brief's name estimateCrop", () => {
    expect(estimateCrop).toBe(estimateCropKg);
  });

  it('gives nothing for no vines or no budbreak', () => {
    expect(estimateCropKg({ vines: 0, budsPerVine: 30, budbreakFraction: 0.9, clustersPerShoot: 1.5, clusterWeightG: 150 })).toBe(0);
    expect(estimateCropKg({ vines: 10, budsPerVine: 30, budbreakFraction: 0, clustersPerShoot: 1.5, clusterWeightG: 150 })).toBe(0);
  });

  it('rejects a budbreak fraction above 1 and negative inputs', () => {
    const ok = { vines: 10, budsPerVine: 30, budbreakFraction: 0.9, clustersPerShoot: 1.5, clusterWeightG: 150 };
    expect(() => estimateCropKg({ ...ok, budbreakFraction: 1.2 })).toThrow(/budbreakFraction/);
    expect(() => estimateCropKg({ ...ok, clusterWeightG: -1 })).toThrow(/clusterWeightG/);
    expect(() => estimateCropKg({ ...ok, vines: Number.NaN })).toThrow(RangeError);
  });
});

describe('crop per area', () => {
  it('uses the 2000 lb short ton, 907.18474 kg exactly', () => {
    expect(SHORT_TON_KG).toBeCloseTo(907.18474, 10);
    expect(cropShortTonsPerAcre(907.18474 * 6, 2)).toBeCloseTo(3, 12);
  });

  it('converts 1 short ton per acre to 2.2417 t/ha (derived from the exact pound and acre)', () => {
    expect(shortTonsPerAcreToTonnesPerHa(1)).toBeCloseTo(2.2417, 4);
  });

  it('gives tonnes per hectare', () => {
    expect(cropTonnesPerHa(24_000, 3)).toBe(8);
    expect(() => cropTonnesPerHa(100, 0)).toThrow(/areaHa/);
  });
});

describe('Ravaz index', () => {
  // AJEV, Cabernet Sauvignon at Oakville CA, 1992, Table 4 (spur-, hedge- and minimally pruned vines).
  it.each([
    [9.8, 1.3, 7.5],
    [20.2, 1.53, 13.2],
    [15.9, 0.29, 54.8],
  ])("gives %f kg / %f kg = %f as published in AJEV's Oakville table", (yieldKg, pruningKg, published) => {
    expect(ravazIndex(yieldKg, pruningKg)).toBeCloseTo(published, 1);
  });

  it('reads 5–10 as balanced for vinifera (Wines & Vines, June 2017, p. 56), both ends included', () => {
    expect(readRavaz(7.5)).toBe('balanced');
    expect(readRavaz(5)).toBe('balanced');
    expect(readRavaz(10)).toBe('balanced');
    expect(readRavaz(4.9)).toBe('under-cropped');
    expect(readRavaz(13.2)).toBe('over-cropped');
    expect(readRavaz(54.8)).toBe('over-cropped');
  });

  it('reads Concord against 10–20 around 15 with the preset (T. Bates, Cornell LERGP, "Vine Size: Magic Number 15")', () => {
    const concord = { ravaz: RAVAZ_PRESETS.concord };
    expect(readRavaz(15, concord)).toBe('balanced');
    expect(readRavaz(20, concord)).toBe('balanced');
    expect(readRavaz(20.5, concord)).toBe('over-cropped');
    expect(readRavaz(9.9, concord)).toBe('under-cropped');
    expect(readRavaz(13.2, concord)).toBe('balanced');
  });

  it('rejects a zero pruning weight and a negative index', () => {
    expect(() => ravazIndex(10, 0)).toThrow(/pruningWeightKg/);
    expect(() => readRavaz(-1)).toThrow(RangeError);
  });
});

describe('estimatePruningLabour', () => {
  it('costs 13.45 hours an acre per minute spent on each of 807 vines, published as "13.5 hours labor per acre" (T. Martinson & J. Vanden Heuvel, Cornell, "Training systems and Labor")', () => {
    const { hours } = estimatePruningLabour({ vines: 807, minutesPerVine: 1, hourlyCost: 0 });
    expect(hours).toBeCloseTo(13.45, 10);
    expect(Math.round(hours * 10) / 10).toBe(13.5);
  });

  it('prices the hours at the hourly cost', () => {
    expect(estimatePruningLabour({ vines: 1200, minutesPerVine: 2.5, hourlyCost: 18 })).toEqual({ hours: 50, cost: 900 });
  });

  it('rejects negative inputs', () => {
    expect(() => estimatePruningLabour({ vines: 10, minutesPerVine: -1, hourlyCost: 10 })).toThrow(/minutesPerVine/);
  });
});

describe('Ravaz by grape type, crop-load target, lag phase and counted clusters', () => {
  it('reads a Concord vine at Ravaz 15 as balanced, not over-cropped (T. Bates, Cornell LERGP, "Vine Size: Magic Number 15")', () => {
    expect(ravazRangeFor('concord')).toEqual({ underBelow: 10, overAbove: 20 });
    expect(readRavaz(15, { ravaz: ravazRangeFor('concord') })).toBe('balanced');
    expect(readRavaz(15, { ravaz: ravazRangeFor('vinifera') })).toBe('over-cropped');
    // Ohio State's "American" row is Concord-type.
    expect(ravazRangeFor('american')).toEqual({ underBelow: 10, overAbove: 20 });
    // Types with no published range read against settings.ravaz (Wines & Vines 2017: 5–10).
    expect(ravazRangeFor('niagara')).toEqual({ underBelow: 5, overAbove: 10 });
    expect(ravazRangeFor(null, { ravaz: { underBelow: 6, overAbove: 9 } })).toEqual({ underBelow: 6, overAbove: 9 });
  });

  it('lets a block or estate set its own Concord-type range, where its adviser reads the vines otherwise', () => {
    const own = { ravazAmerican: { underBelow: 12, overAbove: 18 } };
    expect(ravazRangeFor('concord', own)).toEqual({ underBelow: 12, overAbove: 18 });
    expect(readRavaz(19, { ravaz: ravazRangeFor('concord', own) })).toBe('over-cropped');
    // Bates's 10–20 reads the same vine as balanced.
    expect(readRavaz(19, { ravaz: ravazRangeFor('concord') })).toBe('balanced');
    // The vinifera range is untouched by it.
    expect(ravazRangeFor('vinifera', own)).toEqual({ underBelow: 5, overAbove: 10 });
  });

  it('sets the crop a vine can ripen at Ravaz target × pruning weight: 15 × 1.5 kg = 22.5 kg for Concord (Bates)', () => {
    expect(RAVAZ_TARGETS.concord).toBe(15);
    expect(cropLoadTargetKg(1.5, 15)).toBeCloseTo(22.5, 12);
    // The Oakville spur-pruned vine: 1.30 kg of prunings at its published Ravaz 7.5 carries 9.75 kg, the published 9.8 kg to one decimal (AJEV Table 4).
    expect(Math.round(cropLoadTargetKg(1.3, 7.5) * 10) / 10).toBeCloseTo(9.8, 12);
    expect(() => cropLoadTargetKg(1, 0)).toThrow(/ravazTarget/);
  });

  it('doubles lag-phase cluster weight for harvest (J. Fiola, University of Maryland Extension: "cluster weights will double")', () => {
    expect(harvestClusterWeightG(60)).toBe(120);
    // "this multiplier is not a fixed number": a block's own history sets it.
    expect(harvestClusterWeightG(60, { crop: { lagPhaseMultiplier: 1.8 } })).toBeCloseTo(108, 12);
    expect(() => harvestClusterWeightG(-1)).toThrow(/lagPhaseClusterWeightG/);
  });

  it('takes clusters counted per vine directly, as Dami\'s PY = ANV × NC × CW (OSU, "How to Estimate Grape Yields")', () => {
    // 767 vines × 40 clusters × 0.25 lb / 2000 = 3.835 tons, as in the first test.
    const kg = estimateCropKg({ vines: 767, clustersPerVine: 40, clusterWeightG: lbToKg(0.25) * 1000 });
    expect(cropShortTonsPerAcre(kg, 1)).toBeCloseTo(3.835, 10);
    expect(() => estimateCropKg({ vines: 10, clustersPerVine: -1, clusterWeightG: 100 })).toThrow(/clustersPerVine/);
  });
});
