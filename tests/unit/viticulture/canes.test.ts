import { describe, expect, it } from 'vitest';
import { CANE_REASON_CODES, DEFAULT_SETTINGS, assessCane, caneReasonCode, inToMm, recommendedBudsPerCane } from '@/lib/viticulture';

const { canes: limits, budsPerCane: bands } = DEFAULT_SETTINGS;
// A pencil-thick (3/8 in) sun cane with WineSkills UK's ideal internode of about 60 mm.
const good = { baseDiameterMm: inToMm(3 / 8), longestInternodeMm: 60, exposure: 'sun', colourGood: true, flat: false, origin: 'two-year-wood', injured: false } as const;

describe('assessCane', () => {
  it('calls a pencil-thick sun cane with short internodes, good colour, round, from two-year wood a fruit cane with no reasons', () => {
    expect(assessCane(good)).toEqual({ verdict: 'fruit-cane', reasons: [] });
  });

  it('takes fields left out as unknown, not as faults', () => {
    expect(assessCane({ baseDiameterMm: 9.5 })).toEqual({ verdict: 'fruit-cane', reasons: [] });
  });

  it('marks long internodes as a shade cane, second choice, with a code and the measured values', () => {
    const result = assessCane({ ...good, longestInternodeMm: 140 }, { canes: { shadeInternodeAboveMm: 100 } });
    expect(result).toEqual({ verdict: 'if-nothing-better', reasons: ['shade-cane: longest internode 140 mm exceeds 100 mm'] });
  });

  it('judges internodes against the setting, not a fixed number (common practice, no source)', () => {
    const limit = limits.shadeInternodeAboveMm;
    expect(assessCane({ ...good, longestInternodeMm: limit }).verdict).toBe('fruit-cane');
    expect(assessCane({ ...good, longestInternodeMm: limit + 1 }).verdict).toBe('if-nothing-better');
    // American table grapes have leaves about 6 in (152 mm) apart (grovida.us): such a block raises the limit.
    expect(assessCane({ ...good, longestInternodeMm: 150 }, { canes: { shadeInternodeAboveMm: 160 } }).verdict).toBe('fruit-cane');
  });

  it('counts growth in shade as the same shade-cane fault, once, however many signs there are', () => {
    const result = assessCane({ ...good, exposure: 'shade', longestInternodeMm: 140 });
    expect(result.verdict).toBe('if-nothing-better');
    expect(result.reasons).toEqual(['shade-cane: longest internode 140 mm exceeds 100 mm; grew in shade']);
    expect(assessCane({ ...good, exposure: 'partial' }).verdict).toBe('fruit-cane');
  });

  it('makes a cane under 1/4 in thin (grovida.us "1/4 inch or more"; Yuma Sun 2022 "1/4-1/2 inch")', () => {
    expect(limits.thinBelowMm).toBeCloseTo(inToMm(1 / 4), 12);
    expect(assessCane({ ...good, baseDiameterMm: 6.0 })).toEqual({ verdict: 'if-nothing-better', reasons: ['thin: base diameter 6 mm is under 6.35 mm'] });
    expect(assessCane({ ...good, baseDiameterMm: 6.35 }).verdict).toBe('fruit-cane');
  });

  it('makes a cane over 1/2 in a bull cane (upper end of the Yuma Sun 2022 range)', () => {
    expect(limits.bullAboveMm).toBeCloseTo(inToMm(1 / 2), 12);
    expect(assessCane({ ...good, baseDiameterMm: 12.7 }).verdict).toBe('fruit-cane');
    expect(assessCane({ ...good, baseDiameterMm: 14 })).toEqual({ verdict: 'if-nothing-better', reasons: ['bull-cane: base diameter 14 mm exceeds 12.7 mm'] });
  });

  it('removes a very thin cane outright (below the setting; common practice, no source)', () => {
    const result = assessCane({ ...good, baseDiameterMm: limits.veryThinBelowMm - 0.5 });
    expect(result.verdict).toBe('remove');
    expect(caneReasonCode(result.reasons[0])).toBe('very-thin');
  });

  it('removes an injured cane and a trunk shoot whatever else is right with them', () => {
    expect(assessCane({ ...good, injured: true })).toEqual({ verdict: 'remove', reasons: ['injured: cane is injured'] });
    const trunk = assessCane({ ...good, origin: 'trunk' });
    expect(trunk.verdict).toBe('remove');
    expect(trunk.reasons[0]).toMatch(/^trunk-shoot: .*trunk renewal/);
  });

  it('makes a flat cane, a poorly coloured cane or one from older wood a second choice', () => {
    expect(assessCane({ ...good, flat: true }).reasons).toEqual(['flat: cane is flat, not round']);
    expect(assessCane({ ...good, colourGood: false }).reasons).toEqual(['poor-colour: wood colour shows poor maturity']);
    expect(assessCane({ ...good, origin: 'older-wood' }).reasons).toEqual(['older-wood: arises from wood older than two years']);
    for (const cane of [{ ...good, flat: true }, { ...good, colourGood: false }, { ...good, origin: 'older-wood' as const }]) {
      expect(assessCane(cane).verdict).toBe('if-nothing-better');
    }
  });

  it('removes a cane once its minor faults reach settings.canes.minorFaultsToRemove', () => {
    const twoFaults = { ...good, flat: true, colourGood: false };
    expect(limits.minorFaultsToRemove).toBe(2);
    expect(assessCane(twoFaults).verdict).toBe('remove');
    expect(assessCane(twoFaults, { canes: { minorFaultsToRemove: 3 } }).verdict).toBe('if-nothing-better');
  });

  it('lists disqualifying faults before minor ones, each reason opening with a known code', () => {
    const result = assessCane({ baseDiameterMm: 14, longestInternodeMm: 150, exposure: 'shade', colourGood: false, flat: true, origin: 'older-wood', injured: true });
    const codes = result.reasons.map(caneReasonCode);
    expect(codes).toEqual(['injured', 'bull-cane', 'shade-cane', 'poor-colour', 'flat', 'older-wood']);
    expect(codes.every((code) => code !== undefined && CANE_REASON_CODES.includes(code))).toBe(true);
  });

  it('reads no code from text that does not start with one', () => {
    expect(caneReasonCode('something else: entirely')).toBeUndefined();
  });

  it('rejects a missing or non-positive diameter, a negative internode and an unknown exposure or origin', () => {
    expect(() => assessCane({ baseDiameterMm: 0 })).toThrow(/baseDiameterMm/);
    expect(() => assessCane({ baseDiameterMm: Number.NaN })).toThrow(RangeError);
    expect(() => assessCane({ baseDiameterMm: 9, longestInternodeMm: -1 })).toThrow(/longestInternodeMm/);
    expect(() => assessCane({ baseDiameterMm: 9, exposure: 'moon' as never })).toThrow(/exposure/);
    expect(() => assessCane({ baseDiameterMm: 9, origin: 'root' as never })).toThrow(/origin/);
  });
});

describe('recommendedBudsPerCane', () => {
  it('gives 12–14 buds to a cane of normal thickness, about 3/8 in (product brief; Yuma Sun 2022 "leaving 12-15 buds")', () => {
    expect(recommendedBudsPerCane(inToMm(3 / 8))).toEqual({ min: 12, max: 14 });
  });

  it('gives more, 16–18, to a thicker, more vigorous cane (common practice, no source)', () => {
    expect(recommendedBudsPerCane(12)).toEqual({ min: 16, max: 18 });
    expect(recommendedBudsPerCane(bands.thickFromMm)).toEqual(bands.thick);
  });

  it('gives fewer to a thin cane', () => {
    const thin = recommendedBudsPerCane(7);
    expect(thin).toEqual(bands.thin);
    expect(thin.max).toBeLessThan(bands.normal.min);
  });

  it('stays within the 10–20 nodes of a cane and the 5–15 buds of the Oxford Companion for the normal band (OSU B919; Robinson 2006)', () => {
    const normal = recommendedBudsPerCane(9.5);
    expect(normal.min).toBeGreaterThanOrEqual(10);
    expect(normal.max).toBeLessThanOrEqual(15);
  });

  it('moves its breakpoints with the settings', () => {
    expect(recommendedBudsPerCane(9.5, { budsPerCane: { thickFromMm: 9 } })).toEqual(bands.thick);
    expect(recommendedBudsPerCane(9.5, { budsPerCane: { normal: { min: 10, max: 12 } } })).toEqual({ min: 10, max: 12 });
  });

  it('returns a fresh object, so a caller cannot change the defaults through it', () => {
    const range = recommendedBudsPerCane(9.5) as { min: number; max: number };
    range.min = 1;
    expect(recommendedBudsPerCane(9.5).min).toBe(12);
  });

  it('rejects a non-positive diameter', () => {
    expect(() => recommendedBudsPerCane(-2)).toThrow(RangeError);
  });
});
