import { describe, expect, it } from 'vitest';
import { DEFAULT_SETTINGS, mergeSettings } from '@/lib/viticulture';

describe('settings', () => {
  // Each default is compared with its source's literal figure, converted where the source is in inches.
  it('take the published figures where one exists', () => {
    expect(DEFAULT_SETTINGS.budInjury.extraFromPercent).toBe(20); // Cornell NNY 2014: "if <20% of buds are injured ..."
    expect(DEFAULT_SETTINGS.budInjury.minimalAbovePercent).toBe(50); // Purdue FFF: ">50% bud damage- Minimally prune"
    expect(DEFAULT_SETTINGS.ravaz).toEqual({ underBelow: 5, overAbove: 10 }); // Wines & Vines June 2017: "can range from 5 to 10"
    expect(DEFAULT_SETTINGS.ravazAmerican).toEqual({ underBelow: 10, overAbove: 20 }); // Bates, "Vine Size: Magic Number 15": "< 10 ... undercropped", "> 20 ... overcropped"
    expect(DEFAULT_SETTINGS.pruning.formula).toEqual({ firstUnitBuds: 20, perAdditionalUnitBuds: 20, unit: 'lb' }); // Ohio State 2023: "Vinifera 20 + 20"
    expect(DEFAULT_SETTINGS.plan.budsPerRenewalSpur).toBe(2); // Yuma Sun 2022: "only two buds"
    expect(DEFAULT_SETTINGS.budLoad).toEqual({ minBudsPerFt: 4, maxBudsPerFt: 6 }); // Ohio State 2023: "approximately 4-6 buds per foot"
    expect(DEFAULT_SETTINGS.canes.thinBelowMm).toBeCloseTo((5 / 16) * 25.4, 12); // Westover, Wines & Vines May 2016: "between 5/16 and a half inch"
    expect(DEFAULT_SETTINGS.canes.bullAboveMm).toBeCloseTo(0.5 * 25.4, 12); // eXtension: "large diameter (greater than ½ inch)"
    // The middle of the published 1/4–1/2 in range (grovida.us "1/4 inch or more"; Yuma Sun 2022 "1/4-1/2 inch").
    expect(DEFAULT_SETTINGS.canes.idealMm).toBeCloseTo(((1 / 4 + 1 / 2) / 2) * 25.4, 12);
    expect(DEFAULT_SETTINGS.canes.shadeInternodeAboveMm).toBeCloseTo(6 * 25.4, 12); // eXtension: "very long internodes (5-6 inches or more)"
    expect(DEFAULT_SETTINGS.plan.minSpurSpacingMm).toBeCloseTo(3 * 25.4, 12); // Klodd, UMN Extension: "one spur every 3-5 inches"
    expect(DEFAULT_SETTINGS.crop.lagPhaseMultiplier).toBe(2); // Fiola, UMD: "cluster weights will double from lag phase to harvest"
    expect(DEFAULT_SETTINGS.crop.sampleMarginPercent).toBe(10); // BC Wine Grape Council: "a good estimate will not vary by more than 10%"
  });

  it('keep the unsourced defaults at their documented values (from memory or common practice, no source)', () => {
    expect(DEFAULT_SETTINGS.labour).toEqual({ spurMinutesPerVine: 1, caneMinutesPerVine: 1.75, hourlyCost: 25 });
    expect(DEFAULT_SETTINGS.crop).toMatchObject({ clustersPerShoot: 1.5, clusterWeightG: 100, bearingAfterSeasons: 2, yieldCvPercent: 30 });
    expect(DEFAULT_SETTINGS.budbreak).toEqual({ weakBelowPercent: 75, poorBelowPercent: 50, failedBelowPercent: 20 });
  });

  it('cannot be changed in place', () => {
    expect(Object.isFrozen(DEFAULT_SETTINGS)).toBe(true);
    expect(Object.isFrozen(DEFAULT_SETTINGS.budsPerCane.normal)).toBe(true);
    expect(() => {
      (DEFAULT_SETTINGS.canes as { thinBelowMm: number }).thinBelowMm = 1;
    }).toThrow(TypeError);
  });

  it('merge an override group by group and key by key over the defaults', () => {
    const merged = mergeSettings({ canes: { shadeInternodeAboveMm: 160 }, ravaz: { underBelow: 10, overAbove: 20 } });
    expect(merged.canes).toEqual({ ...DEFAULT_SETTINGS.canes, shadeInternodeAboveMm: 160 });
    expect(merged.ravaz).toEqual({ underBelow: 10, overAbove: 20 });
    expect(merged.budbreak).toEqual(DEFAULT_SETTINGS.budbreak);
    expect(DEFAULT_SETTINGS.canes.shadeInternodeAboveMm).toBe(152.4);
  });

  it('return the defaults for an empty override, and keep the default for a key stored as undefined', () => {
    expect(mergeSettings()).toEqual(DEFAULT_SETTINGS);
    expect(mergeSettings({ canes: { thinBelowMm: undefined } }).canes.thinBelowMm).toBe(DEFAULT_SETTINGS.canes.thinBelowMm);
  });

  it("copy objects they are given rather than freezing the caller's", () => {
    const normal = { min: 10, max: 12 };
    const merged = mergeSettings({ budsPerCane: { normal } });
    expect(merged.budsPerCane.normal).toEqual(normal);
    expect(Object.isFrozen(normal)).toBe(false);
  });

  it('accept a merged result back as an override unchanged', () => {
    const merged = mergeSettings({ budbreak: { weakBelowPercent: 80 } });
    expect(mergeSettings(merged)).toEqual(merged);
  });

  it('reject unknown groups and keys, so a typo in a stored override is caught', () => {
    expect(() => mergeSettings({ cane: {} } as never)).toThrow(/unknown settings group 'cane'/);
    expect(() => mergeSettings({ canes: { thinMm: 5 } } as never)).toThrow(/unknown setting 'canes.thinMm'/);
  });

  it.each([
    [{ canes: { thinBelowMm: -1 } }, /settings.canes.thinBelowMm must be a finite number/],
    [{ canes: { thinBelowMm: Number.NaN } }, /thinBelowMm/],
    [{ canes: { thinBelowMm: 14 } }, /veryThinBelowMm <= thinBelowMm <= bullAboveMm/],
    [{ budsPerCane: { normal: { min: 14, max: 12 } } }, /settings.budsPerCane.normal must be \{ min, max \}/],
    [{ budsPerCane: { thin: { min: 8.5, max: 10 } } }, /settings.budsPerCane.thin/],
    [{ budbreak: { poorBelowPercent: 90 } }, /failedBelowPercent <= poorBelowPercent <= weakBelowPercent/],
    [{ budbreak: { weakBelowPercent: 120 } }, /must not exceed 100/],
    [{ ravaz: { underBelow: 12 } }, /underBelow <= overAbove/],
    [{ plan: { canesPerVine: 5 } }, /canesPerVine <= maxCanesPerVine/],
    [{ plan: { canesPerVine: 1.5 } }, /must be a whole number/],
    [{ plan: { canesPerVine: 0 } }, /at least 1/],
    [{ pruning: { formula: { firstUnitBuds: 20, perAdditionalUnitBuds: 20, unit: 'oz' } } }, /formula.unit/],
    [{ labour: { caneMinutesPerVine: 0.5 } }, /spurMinutesPerVine <= caneMinutesPerVine/],
    [{ labour: { hourlyCost: -1 } }, /settings.labour.hourlyCost/],
    [{ crop: { bearingAfterSeasons: 2.5 } }, /bearingAfterSeasons must be a whole number/],
    [{ crop: { clusterWeightG: Number.POSITIVE_INFINITY } }, /settings.crop.clusterWeightG/],
    [{ budLoad: { minBudsPerFt: 7 } }, /minBudsPerFt <= maxBudsPerFt/],
    [{ crop: { lagPhaseMultiplier: 0.5 } }, /lagPhaseMultiplier must be at least 1/],
    [{ budsPerCane: { thickFromMm: 14 } }, /thickFromMm <= canes.bullAboveMm/],
  ])('reject an override that makes no sense: %o', (override, message) => {
    expect(() => mergeSettings(override as never)).toThrow(message);
    expect(() => mergeSettings(override as never)).toThrow(RangeError);
  });
});
