import { describe, expect, it } from 'vitest';
import { layerSettings, overlaySettings, overriddenKeys, SETTING_KEYS, SETTINGS_META, settingValue } from '@/lib/viticulture';
import { settingsOverrideSchema } from '@/lib/validation/settings';

describe('layerSettings (defaults ← organisation ← block)', () => {
  it('gives the defaults, each from "default", when nothing is stored', () => {
    const { settings, origin, ignored } = layerSettings();
    // eXtension: bull canes are "greater than ½ inch" (12.7 mm).
    expect(settings.canes.bullAboveMm).toBe(12.7);
    expect(Object.values(origin).every((o) => o === 'default')).toBe(true);
    expect(ignored).toEqual([]);
  });

  it('lays the block over the organisation, key by key, saying where each value came from', () => {
    const { settings, origin } = layerSettings(
      { canes: { shadeInternodeAboveMm: 127, bullAboveMm: 12 }, ravaz: { overAbove: 12 } },
      { canes: { bullAboveMm: 11.5 } },
    );
    expect(settings.canes).toMatchObject({ shadeInternodeAboveMm: 127, bullAboveMm: 11.5, thinBelowMm: (5 / 16) * 25.4 });
    expect(settings.ravaz).toEqual({ underBelow: 5, overAbove: 12 });
    expect(origin['canes.bullAboveMm']).toBe('block');
    expect(origin['canes.shadeInternodeAboveMm']).toBe('organisation');
    expect(origin['ravaz.overAbove']).toBe('organisation');
    expect(origin['ravaz.underBelow']).toBe('default');
  });

  it('replaces a range or formula as a whole', () => {
    const { settings, origin } = layerSettings(
      { budsPerCane: { thin: { min: 6, max: 8 } } },
      { pruning: { formula: { firstUnitBuds: 30, perAdditionalUnitBuds: 10, unit: 'lb' } } },
    );
    expect(settings.budsPerCane.thin).toEqual({ min: 6, max: 8 });
    // Cornell LERGP (Bates): Concord 30 + 10.
    expect(settings.pruning.formula).toEqual({ firstUnitBuds: 30, perAdditionalUnitBuds: 10, unit: 'lb' });
    expect(origin['pruning.formula']).toBe('block');
  });

  it('leaves out a level that no longer holds over the ones beneath it, and says so', () => {
    // Thick from 12 mm holds under the default 12.7 mm bull limit; a block with bull above 11.5 breaks it.
    const layered = layerSettings({ budsPerCane: { thickFromMm: 12 } }, { canes: { bullAboveMm: 11.5 } });
    expect(layered.settings.budsPerCane.thickFromMm).toBe(12);
    expect(layered.settings.canes.bullAboveMm).toBe(12.7);
    expect(layered.origin['canes.bullAboveMm']).toBe('default');
    expect(layered.ignored).toEqual([{ level: 'block', message: expect.stringContaining('bullAboveMm') }]);

    const badOrg = layerSettings({ ravaz: { underBelow: 12 } }, { canes: { bullAboveMm: 13 } });
    expect(badOrg.ignored.map((i) => i.level)).toEqual(['organisation']);
    expect(badOrg.settings.ravaz.underBelow).toBe(5);
    expect(badOrg.settings.canes.bullAboveMm).toBe(13);
  });

  it('treats undefined and empty groups as setting nothing', () => {
    expect(overriddenKeys({ canes: { bullAboveMm: undefined }, ravaz: {} })).toEqual([]);
    expect(overlaySettings({ canes: { bullAboveMm: 12 } }, { canes: { bullAboveMm: undefined } })).toEqual({ canes: { bullAboveMm: 12 } });
  });
});

describe('settings metadata and schema', () => {
  it('names a unit, a step and a source for every setting', () => {
    expect(SETTING_KEYS).toHaveLength(45);
    for (const key of SETTING_KEYS) {
      const meta = SETTINGS_META[key];
      expect(meta.source.length, key).toBeGreaterThan(10);
      expect(meta.step, key).toBeGreaterThan(0);
      expect(settingValue(layerSettings().settings, key), key).toBeDefined();
    }
    expect(SETTINGS_META['canes.bullAboveMm'].source).toMatch(/eXtension/);
    expect(SETTINGS_META['budLoad.maxBudsPerFt'].source).toMatch(/Ohio State/);
  });

  it('accepts partial overrides and refuses unknown keys, negatives and broken ranges', () => {
    expect(settingsOverrideSchema.safeParse({ canes: { bullAboveMm: 11.5 } }).success).toBe(true);
    expect(settingsOverrideSchema.safeParse({}).success).toBe(true);
    expect(settingsOverrideSchema.safeParse({ canes: { wide: 1 } }).success).toBe(false);
    expect(settingsOverrideSchema.safeParse({ nope: {} }).success).toBe(false);
    expect(settingsOverrideSchema.safeParse({ canes: { bullAboveMm: -1 } }).success).toBe(false);
    expect(settingsOverrideSchema.safeParse({ plan: { canesPerVine: 2.5 } }).success).toBe(false);
    expect(settingsOverrideSchema.safeParse({ budsPerCane: { thin: { min: 9, max: 8 } } }).success).toBe(false);
    expect(settingsOverrideSchema.safeParse({ pruning: { formula: { firstUnitBuds: 20, perAdditionalUnitBuds: 20, unit: 'oz' } } }).success).toBe(false);
  });
});
