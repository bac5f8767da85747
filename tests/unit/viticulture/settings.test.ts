import { describe, expect, it } from 'vitest';
import { BALANCED_PRUNING_FORMULAS, DEFAULT_SETTINGS, mergeSettings } from '@/lib/viticulture';

describe('settings', () => {
  it('default to the published figures where one exists', () => {
    expect(DEFAULT_SETTINGS.budInjury).toEqual({ extraFromPercent: 20, minimalAbovePercent: 80 }); // Cornell NNY 2014
    expect(DEFAULT_SETTINGS.ravaz).toEqual({ underBelow: 5, overAbove: 10 }); // Wines & Vines 2017
    expect(DEFAULT_SETTINGS.pruning.formula).toBe(BALANCED_PRUNING_FORMULAS.vinifera); // Ohio State 2023
    expect(DEFAULT_SETTINGS.plan.budsPerRenewalSpur).toBe(2); // OSU B919; Yuma Sun 2022
  });

  it('make cane pruning the slower kind of pruning, between 1.5 and 2 times spur pruning', () => {
    const { spurMinutesPerVine, caneMinutesPerVine } = DEFAULT_SETTINGS.labour;
    expect(caneMinutesPerVine / spurMinutesPerVine).toBeGreaterThanOrEqual(1.5);
    expect(caneMinutesPerVine / spurMinutesPerVine).toBeLessThanOrEqual(2);
    // Martinson & Vanden Heuvel (Cornell): one minute per vine is 13.5 h/acre at 807 vines/acre.
    expect((807 * spurMinutesPerVine) / 60).toBeCloseTo(13.45, 2);
  });

  it('give a crop estimate middling wine-grape defaults and count replants as bearing from their third leaf', () => {
    expect(DEFAULT_SETTINGS.crop).toEqual({ clustersPerShoot: 1.5, clusterWeightG: 100, bearingAfterSeasons: 2 });
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
    expect(DEFAULT_SETTINGS.canes.shadeInternodeAboveMm).toBe(100);
  });

  it('return the defaults for an empty override, and keep the default for a key stored as undefined', () => {
    expect(mergeSettings()).toEqual(DEFAULT_SETTINGS);
    expect(mergeSettings({ canes: { thinBelowMm: undefined } }).canes.thinBelowMm).toBe(DEFAULT_SETTINGS.canes.thinBelowMm);
  });

  it('copy objects they are given rather than freezing the caller\'s', () => {
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
  ])('reject an override that makes no sense: %o', (override, message) => {
    expect(() => mergeSettings(override as never)).toThrow(message);
    expect(() => mergeSettings(override as never)).toThrow(RangeError);
  });
});
