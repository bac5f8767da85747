import { describe, expect, it } from 'vitest';
import { CANE_REASON_CODES, assessCane, caneReasonCode, inToMm, recommendedBudsPerCane } from '@/lib/viticulture';

// Every limit below is a literal from its source, never read back from DEFAULT_SETTINGS.
// A pencil-thick (3/8 in) sun cane with WineSkills UK's ideal internode of about 60 mm.
const good = {
  baseDiameterMm: inToMm(3 / 8),
  longestInternodeMm: 60,
  exposure: 'sun',
  colourGood: true,
  flat: false,
  origin: 'two-year-wood',
  injured: false,
} as const;

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

  it('takes ordinary 4–6 in internodes (102–152 mm) as a good cane and about 8 in (203 mm) as a shade cane (eXtension bull-cane page: "very long internodes (5-6 inches or more)")', () => {
    expect(assessCane({ ...good, longestInternodeMm: 110 }).verdict).toBe('fruit-cane');
    expect(assessCane({ ...good, longestInternodeMm: inToMm(4) }).verdict).toBe('fruit-cane');
    expect(assessCane({ ...good, longestInternodeMm: inToMm(6) }).verdict).toBe('fruit-cane');
    expect(assessCane({ ...good, longestInternodeMm: 153 }).verdict).toBe('if-nothing-better');
    expect(assessCane({ ...good, longestInternodeMm: inToMm(8) }).reasons).toEqual(['shade-cane: longest internode 203.2 mm exceeds 152.4 mm']);
  });

  it('counts growth in shade as the same shade-cane fault, once, however many signs there are', () => {
    const result = assessCane({ ...good, exposure: 'shade', longestInternodeMm: 200 });
    expect(result.verdict).toBe('if-nothing-better');
    expect(result.reasons).toEqual(['shade-cane: longest internode 200 mm exceeds 152.4 mm; grew in shade']);
    expect(assessCane({ ...good, exposure: 'partial' }).verdict).toBe('fruit-cane');
  });

  it('makes a cane under 5/16 in thin (F. Westover, Wines & Vines, May 2016: fruitful wood "between 5/16 and a half inch")', () => {
    expect(assessCane({ ...good, baseDiameterMm: 7.9 })).toEqual({ verdict: 'if-nothing-better', reasons: ['thin: base diameter 7.9 mm is under 7.94 mm'] });
    expect(assessCane({ ...good, baseDiameterMm: inToMm(5 / 16) }).verdict).toBe('fruit-cane');
    // A block following the garden sources' 1/4 in (grovida.us, Yuma Sun 2022) sets it.
    expect(assessCane({ ...good, baseDiameterMm: 7 }, { canes: { thinBelowMm: inToMm(1 / 4) } }).verdict).toBe('fruit-cane');
  });

  it('removes a bull cane over 1/2 in: "poor selections ... for spurs or fruiting canes" (eXtension, "What are bull canes")', () => {
    expect(assessCane({ ...good, baseDiameterMm: inToMm(1 / 2) }).verdict).toBe('fruit-cane');
    expect(assessCane({ ...good, baseDiameterMm: 14 })).toEqual({ verdict: 'remove', reasons: ['bull-cane: base diameter 14 mm exceeds 12.7 mm'] });
    expect(assessCane({ ...good, baseDiameterMm: 14 }, { canes: { bullAboveMm: 16 } }).verdict).toBe('fruit-cane');
  });

  it('removes a very thin cane outright, under 3/16 in (4.8 mm; common practice, no source)', () => {
    const result = assessCane({ ...good, baseDiameterMm: 4.7 });
    expect(result.verdict).toBe('remove');
    expect(caneReasonCode(result.reasons[0]!)).toBe('very-thin');
    expect(assessCane({ ...good, baseDiameterMm: 4.8 }).reasons.map(caneReasonCode)).toEqual(['thin']);
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
    for (const cane of [
      { ...good, flat: true },
      { ...good, colourGood: false },
      { ...good, origin: 'older-wood' as const },
    ]) {
      expect(assessCane(cane).verdict).toBe('if-nothing-better');
    }
  });

  it('removes a cane with two minor faults (settings.canes.minorFaultsToRemove; common practice, no source)', () => {
    const twoFaults = { ...good, flat: true, colourGood: false };
    expect(assessCane({ ...good, flat: true }).verdict).toBe('if-nothing-better');
    expect(assessCane(twoFaults).verdict).toBe('remove');
    expect(assessCane(twoFaults, { canes: { minorFaultsToRemove: 3 } }).verdict).toBe('if-nothing-better');
  });

  it('lists disqualifying faults before minor ones, each reason opening with a known code', () => {
    const result = assessCane({
      baseDiameterMm: 14,
      longestInternodeMm: 200,
      exposure: 'shade',
      colourGood: false,
      flat: true,
      origin: 'older-wood',
      injured: true,
    });
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

  it('gives more, 16–18, to a thick cane from 7/16 in up to the 1/2 in bull-cane limit (product brief; common practice, no source)', () => {
    expect(recommendedBudsPerCane(12)).toEqual({ min: 16, max: 18 });
    expect(recommendedBudsPerCane(11.2)).toEqual({ min: 16, max: 18 }); // just over 7/16 in (11.11 mm)
    expect(recommendedBudsPerCane(inToMm(1 / 2))).toEqual({ min: 16, max: 18 });
  });

  it('gives a bull cane no extra buds: bull canes are "poorly fruitful or unfruitful" (eXtension)', () => {
    expect(recommendedBudsPerCane(14)).toEqual({ min: 12, max: 14 });
  });

  it('gives 8–10 to a thin cane, with the same 5/16 in limit assessCane calls thin (Westover, Wines & Vines, May 2016)', () => {
    expect(recommendedBudsPerCane(7)).toEqual({ min: 8, max: 10 });
    expect(recommendedBudsPerCane(7.9)).toEqual({ min: 8, max: 10 });
    expect(recommendedBudsPerCane(inToMm(5 / 16))).toEqual({ min: 12, max: 14 });
    // One limit: a cane the verdict calls thin is never given the normal band.
    for (const d of [5, 6.35, 7, 7.9, 7.93]) {
      expect(caneReasonCode(assessCane({ ...good, baseDiameterMm: d }).reasons[0] ?? '')).toBe('thin');
      expect(recommendedBudsPerCane(d)).toEqual({ min: 8, max: 10 });
    }
  });

  it('stays within the 10–20 nodes of a cane and the 5–15 buds of the Oxford Companion for the normal band (OSU B919; Robinson 2006)', () => {
    const normal = recommendedBudsPerCane(9.5);
    expect(normal.min).toBeGreaterThanOrEqual(10);
    expect(normal.max).toBeLessThanOrEqual(15);
  });

  it('moves its breakpoints with the settings', () => {
    expect(recommendedBudsPerCane(9.5, { budsPerCane: { thickFromMm: 9 } })).toEqual({ min: 16, max: 18 });
    expect(recommendedBudsPerCane(7, { canes: { thinBelowMm: 6.35 } })).toEqual({ min: 12, max: 14 });
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
