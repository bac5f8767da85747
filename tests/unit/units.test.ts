import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { formatAreaM2, formatLengthM, formatLengthMm, formatVinesPerArea, parseAreaM2, parseLength, vinesPerAreaFor } from '@/lib/units';
import { ftToM, inToMm } from '@/lib/viticulture';

describe('lengths for display', () => {
  it('shows metric spacings in metres to the millimetre', () => {
    expect(formatLengthM(2.4, 'metric')).toBe('2.4 m');
    expect(formatLengthM(1.375, 'metric')).toBe('1.375 m');
    expect(formatLengthM(1.2345, 'metric')).toBe('1.235 m');
  });

  it('shows imperial spacings in feet and inches, to the nearest eighth of an inch', () => {
    expect(formatLengthM(ftToM(8), 'imperial')).toBe('8 ft');
    // 2.4 m = 94.488 in = 7 ft 10.488 in.
    expect(formatLengthM(2.4, 'imperial')).toBe('7 ft 10 1/2 in');
    expect(formatLengthM(ftToM(7.5), 'imperial')).toBe('7 ft 6 in');
    expect(formatLengthM(inToMm(9) / 1000, 'imperial')).toBe('9 in');
    // 11 15/16 in rounds up to a whole foot rather than showing "0 ft 12 in".
    expect(formatLengthM(inToMm(11.97) / 1000, 'imperial')).toBe('1 ft');
  });

  it('shows small sizes in millimetres or in fractions of an inch, as growers read cane diameters', () => {
    expect(formatLengthMm(9.5, 'metric')).toBe('9.5 mm');
    expect(formatLengthMm(9.525, 'imperial')).toBe('3/8 in');
    expect(formatLengthMm(6.35, 'imperial')).toBe('1/4 in');
    expect(formatLengthMm(12.7, 'imperial')).toBe('1/2 in');
    expect(formatLengthMm(31.75, 'imperial')).toBe('1 1/4 in');
    expect(formatLengthMm(8, 'imperial')).toBe('5/16 in');
  });
});

describe('lengths as typed', () => {
  it.each<[string, number]>([
    ['2.4', 2.4],
    ['2.4 m', 2.4],
    ['2,4', 2.4],
    ['2400 mm', 2.4],
    ['240 cm', 2.4],
    ['2 m 40 cm', 2.4],
    ['8 ft', ftToM(8)],
  ])('reads %s on a metric estate', (text, metres) => {
    expect(parseLength(text, 'metric', 'm')).toBeCloseTo(metres, 12);
  });

  it.each<[string, number]>([
    ['8', 8],
    ['8 ft', 8],
    ['8 feet', 8],
    ['7\' 6"', 7.5],
    ['7′6″', 7.5],
    ['7 ft 6 in', 7.5],
    ['7 6', 7.5],
    ['7 ft 6 1/2 in', 7 + 6.5 / 12],
    ['7 ft 6½ in', 7 + 6.5 / 12],
    ['90 in', 7.5],
  ])('reads %s on an imperial estate as feet and inches', (text, feet) => {
    expect(parseLength(text, 'imperial', 'm')).toBeCloseTo(ftToM(feet), 12);
  });

  it('takes an explicit metric unit on an imperial estate', () => {
    expect(parseLength('2.4 m', 'imperial', 'm')).toBeCloseTo(2.4, 12);
  });

  it('reads bare small sizes as millimetres or inches', () => {
    expect(parseLength('9.5', 'metric', 'mm')).toBe(9.5);
    expect(parseLength('3/8', 'imperial', 'mm')).toBeCloseTo(9.525, 12);
    expect(parseLength('0.375 in', 'imperial', 'mm')).toBeCloseTo(9.525, 12);
    expect(parseLength('10 mm', 'imperial', 'mm')).toBe(10);
  });

  it.each(['', '   ', 'wide', '-2', '2 m 3 ft', '3 ft 2 m', '1/0', '2 metres and a bit', '2.4 km'])('gives null for %j rather than guessing', (text) => {
    expect(parseLength(text, 'metric', 'm')).toBeNull();
    expect(parseLength(text, 'imperial', 'm')).toBeNull();
  });

  it('reads back what it shows: metric exactly to the millimetre, imperial within a sixteenth of an inch', () => {
    fc.assert(
      fc.property(fc.integer({ min: 200, max: 15_000 }), (mm) => {
        const metres = mm / 1000;
        expect(parseLength(formatLengthM(metres, 'metric'), 'metric', 'm')).toBeCloseTo(metres, 9);
        const back = parseLength(formatLengthM(metres, 'imperial'), 'imperial', 'm')!;
        expect(Math.abs(back - metres) * 1000).toBeLessThanOrEqual(inToMm(1 / 16) + 1e-9);
      }),
    );
  });
});

describe('areas and planting density', () => {
  it('shows areas in hectares or acres', () => {
    expect(formatAreaM2(12_345, 'metric')).toBe('1.23 ha');
    expect(formatAreaM2(4046.8564224, 'imperial')).toBe('1 acre');
    expect(formatAreaM2(10_000, 'imperial')).toBe('2.47 acres');
    expect(formatAreaM2(250_000, 'metric')).toBe('25 ha');
  });

  it('reads areas typed in either unit', () => {
    expect(parseAreaM2('2.5', 'metric')).toBeCloseTo(25_000, 9);
    expect(parseAreaM2('1', 'imperial')).toBeCloseTo(4046.8564224, 9);
    expect(parseAreaM2('2 ha', 'imperial')).toBeCloseTo(20_000, 9);
    expect(parseAreaM2('lots', 'metric')).toBeNull();
  });

  // BC Wine Grape Council crop-estimation table: 6 ft × 9 ft → 807 vines per acre.
  it('gives vines per acre from lib/viticulture for spacings stored in metres', () => {
    expect(vinesPerAreaFor(ftToM(9), ftToM(6), 'imperial')).toBeCloseTo(806.67, 2);
    expect(formatVinesPerArea(ftToM(9), ftToM(6), 'imperial')).toBe('807 vines/acre');
  });

  it('gives vines per hectare for metric spacings', () => {
    expect(formatVinesPerArea(2.5, 1.2, 'metric')).toBe('3,333 vines/ha');
  });
});
