import { describe, expect, it } from 'vitest';
import { formToRecord, recordToForm } from '@/lib/units/observation';

// NIST SP 811 (2008 ed.), Appendix B.8/B.9: inch = 2.54 × 10⁻² m and pound (avoirdupois) =
// 4.535 923 7 × 10⁻¹ kg, both exact since the 1959 international yard and pound agreement.
const MM_PER_INCH = 25.4;
const KG_PER_POUND = 0.45359237;

describe('an observation typed on an imperial estate is kept in metric', () => {
  it('turns a 1/2 in cane into 12.7 mm and a 3/8 in cane into 9.525 mm to the 0.01 mm (NIST SP 811 B.8)', () => {
    expect(formToRecord({ diameterMm: 0.5 }, 'imperial')).toEqual({ diameterMm: 12.7 });
    const kept = formToRecord({ diameterMm: 0.375 }, 'imperial').diameterMm as number;
    expect(Math.abs(kept - 0.375 * MM_PER_INCH)).toBeLessThanOrEqual(0.005 + 1e-9);
  });

  it('turns a 4 in internode into 101.6 mm exactly', () => {
    expect(formToRecord({ longestInternodeMm: 4 }, 'imperial')).toEqual({ longestInternodeMm: 101.6 });
  });

  it('turns 1 lb of prunings into 0.454 kg and 2.2 lb into 0.998 kg (NIST SP 811 B.9)', () => {
    expect(formToRecord({ pruningWeightKg: 1 }, 'imperial')).toEqual({ pruningWeightKg: Math.round(KG_PER_POUND * 1000) / 1000 });
    expect(formToRecord({ pruningWeightKg: 2.2 }, 'imperial')).toEqual({ pruningWeightKg: 0.998 });
  });

  it('leaves counts, choices and metric estates alone, and drops blanks', () => {
    expect(formToRecord({ budsRetained: 24, exposure: 'sun', flat: false, note: '', diameterMm: undefined, budsPushed: Number.NaN }, 'imperial')).toEqual({
      budsRetained: 24,
      exposure: 'sun',
      flat: false,
    });
    expect(formToRecord({ diameterMm: 9.5, pruningWeightKg: 0.8 }, 'metric')).toEqual({ diameterMm: 9.5, pruningWeightKg: 0.8 });
  });

  it('passes a negative number through unconverted, for the schema to refuse', () => {
    expect(formToRecord({ diameterMm: -1 }, 'imperial')).toEqual({ diameterMm: -1 });
  });
});

describe('a record opened again on an imperial estate shows what was typed', () => {
  it('shows 9.53 mm as 0.375 in and 101.6 mm as 4 in', () => {
    expect(recordToForm({ diameterMm: 9.53, longestInternodeMm: 101.6 }, 'imperial')).toEqual({ diameterMm: 0.375, longestInternodeMm: 4 });
  });

  it('shows 1 kg as 2.2 lb (1 / 0.453 592 37 = 2.204 6 lb, NIST SP 811 B.9)', () => {
    expect(recordToForm({ pruningWeightKg: 1 }, 'imperial')).toEqual({ pruningWeightKg: 2.2 });
    expect(1 / KG_PER_POUND).toBeCloseTo(2.20462, 5);
  });

  it('round-trips every sixteenth of an inch from 1/16 to 1 in', () => {
    for (let n = 1; n <= 16; n++) {
      const typed = n / 16;
      const back = recordToForm(formToRecord({ diameterMm: typed }, 'imperial'), 'imperial').diameterMm as number;
      expect(Math.abs(back - typed)).toBeLessThanOrEqual(0.001);
    }
  });

  it('keeps metric records as they are', () => {
    expect(recordToForm({ diameterMm: 9.5, state: 'dead' }, 'metric')).toEqual({ diameterMm: 9.5, state: 'dead' });
  });
});
