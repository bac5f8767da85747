import { describe, expect, it } from 'vitest';
import { acToHa, ftToM, vinesPerAcre, vinesPerArea, vinesPerHectare } from '@/lib/viticulture';

describe('vines per area', () => {
  // BC Wine Grape Council, best-practice guide, crop-estimation table (spacings in feet); published
  // figures are rounded to the nearest vine.
  it.each([
    [3, 7, 2074],
    [4, 7, 1556],
    [3, 8, 1815],
    [4, 8, 1361],
    [5, 8, 1089],
    [4, 9, 1210],
    [5, 9, 968],
    [6, 9, 807],
  ])('%i × %i ft gives %i vines per acre after rounding to the nearest vine (BC Wine Grape Council)', (vine, row, published) => {
    expect(Math.round(vinesPerAcre(row, vine))).toBe(published);
  });

  it('8 × 9 ft gives 605 vines per acre (wine-grape-growing.com, "Crop Estimation Methods")', () => {
    expect(vinesPerAcre(9, 8)).toBe(605);
  });

  it('returns the unrounded value: 6 × 9 ft is 806.67, published as 807 (Dami, OSU; BC Wine Grape Council)', () => {
    expect(vinesPerAcre(9, 6)).toBeCloseTo(806.6667, 4);
  });

  it('2.5 m × 1.2 m gives 3333.33 vines per hectare, and 2.4 × 1.5 m gives 2777.8 (10 000 m² / 3 m² per vine)', () => {
    expect(vinesPerHectare(2.5, 1.2)).toBeCloseTo(3333.333, 3);
    expect(vinesPerHectare(2.4, 1.5)).toBeCloseTo(2777.78, 2);
  });

  it('gives the same planting density whether worked in feet per acre or metres per hectare', () => {
    const perHa = vinesPerHectare(ftToM(9), ftToM(6));
    expect(vinesPerAcre(9, 6)).toBeCloseTo(perHa * acToHa(1), 9);
  });

  it('vinesPerArea delegates by area unit: feet for acres, metres for hectares', () => {
    expect(vinesPerArea(9, 6, 'acre')).toBe(vinesPerAcre(9, 6));
    expect(vinesPerArea(2.5, 1.2, 'ha')).toBe(vinesPerHectare(2.5, 1.2));
    expect(() => vinesPerArea(2.5, 1.2, 'sqft' as never)).toThrow(RangeError);
  });

  it('rejects zero, negative and missing spacings', () => {
    expect(() => vinesPerAcre(0, 6)).toThrow(/rowSpacingFt must be .* greater than 0/);
    expect(() => vinesPerHectare(2.5, -1)).toThrow(RangeError);
    expect(() => vinesPerHectare(Number.NaN, 1)).toThrow(RangeError);
  });
});
