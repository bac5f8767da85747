import convert from 'convert-units';
import { describe, expect, it } from 'vitest';
import { acToHa, ftToM, haToAc, inToMm, kgToLb, lbToKg, mToFt, mmToIn } from '@/lib/viticulture';

describe('unit conversions', () => {
  it('an inch is exactly 25.4 mm (NIST Handbook 44, 2026, Appendix C: "2.54 centimeters (exactly)")', () => {
    expect(inToMm(1)).toBe(25.4);
    expect(mmToIn(25.4)).toBe(1);
  });

  it('a pound is exactly 0.45359237 kg (NBS, "Refinement of Values for the Yard and the Pound", 1959)', () => {
    expect(lbToKg(1)).toBe(0.45359237);
    expect(kgToLb(0.45359237)).toBe(1);
  });

  it('a foot is exactly 0.3048 m (the 1959 yard of exactly 0.9144 m)', () => {
    expect(ftToM(1)).toBe(0.3048);
    expect(ftToM(3)).toBeCloseTo(0.9144, 15);
    expect(mToFt(0.3048)).toBe(1);
  });

  it('an acre is 0.404 685 642 24 ha exactly and a hectare about 2.471 acres (NIST Handbook 44, 2026, Appendix C)', () => {
    expect(acToHa(1)).toBeCloseTo(0.40468564224, 14);
    expect(haToAc(1)).toBeCloseTo(2.4710538, 7);
  });

  it('the published cane diameters convert as check-values derives: 1/4 in 6.35 mm, 3/8 in 9.525 mm, 1/2 in 12.7 mm', () => {
    expect(inToMm(1 / 4)).toBeCloseTo(6.35, 12);
    expect(inToMm(3 / 8)).toBeCloseTo(9.525, 12);
    expect(inToMm(1 / 2)).toBeCloseTo(12.7, 12);
  });

  // convert-units 2.3.4 stores rounded factors (0.453592 kg per lb), so it agrees to about six figures.
  it.each([
    ['in', 'mm', inToMm],
    ['mm', 'in', mmToIn],
    ['lb', 'kg', lbToKg],
    ['kg', 'lb', kgToLb],
    ['ft', 'm', ftToM],
    ['m', 'ft', mToFt],
    ['ac', 'ha', acToHa],
    ['ha', 'ac', haToAc],
  ] as const)('agrees with convert-units from %s to %s to within one part in a million', (from, to, ours) => {
    for (const value of [1, 3.7, 250]) {
      const theirs = convert(value).from(from).to(to);
      expect(Math.abs(ours(value) - theirs) / theirs).toBeLessThan(1e-6);
    }
  });

  it.each([-1, Number.NaN, Number.POSITIVE_INFINITY])('rejects %s with a RangeError naming the argument', (bad) => {
    expect(() => inToMm(bad)).toThrow(RangeError);
    expect(() => lbToKg(bad)).toThrow(/lb must be/);
    expect(() => mToFt(bad)).toThrow(RangeError);
  });
});
