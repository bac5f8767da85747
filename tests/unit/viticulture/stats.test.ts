import { errorFunction, probit } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { normalQuantile, wilsonInterval, zForConfidence } from '@/lib/viticulture';

const normalCdf = (z: number) => (1 + errorFunction(z / Math.SQRT2)) / 2;

describe('normalQuantile', () => {
  it('gives z = 1.959964 for 95% two-sided confidence (the value check-values uses for Wilson intervals)', () => {
    expect(normalQuantile(0.975)).toBeCloseTo(1.959964, 6);
    expect(zForConfidence(0.95)).toBeCloseTo(1.959964, 6);
  });

  // Standard normal table values (any statistics text), to 9 decimals.
  it.each([
    [0.5, 0],
    [0.9, 1.281551566],
    [0.95, 1.644853627],
    [0.995, 2.575829304],
    [0.999, 3.090232306],
    [0.9999, 3.719016485],
    [0.025, -1.959963985],
  ])('gives the table value at p = %f', (p, z) => {
    expect(normalQuantile(p)).toBeCloseTo(z, 9);
  });

  it("agrees with simple-statistics' probit to its own accuracy (within 0.5%; it uses a closed-form erf inverse)", () => {
    for (const p of [0.6, 0.8, 0.9, 0.95, 0.975, 0.99, 0.995, 0.2, 0.05]) {
      expect(Math.abs(normalQuantile(p) - probit(p)) / Math.abs(normalQuantile(p))).toBeLessThan(0.005);
    }
    expect(probit(0.975)).toBeCloseTo(1.96, 2);
  });

  it("inverts simple-statistics' normal CDF (errorFunction, accurate to about 1e-7), deep into both tails", () => {
    for (const p of [1e-6, 0.001, 0.01, 0.02425, 0.1, 0.3, 0.5, 0.7, 0.9, 0.975, 0.99, 0.999, 1 - 1e-6]) {
      expect(Math.abs(normalCdf(normalQuantile(p)) - p)).toBeLessThan(2e-7);
    }
  });

  it('is symmetric about one half and handles the far tail beyond r = 5', () => {
    expect(normalQuantile(0.2)).toBeCloseTo(-normalQuantile(0.8), 14);
    expect(normalQuantile(1e-20)).toBeCloseTo(-9.262340089798, 9);
  });

  it('rejects probabilities of 0, 1 and outside', () => {
    for (const bad of [0, 1, -0.1, 1.1, Number.NaN]) expect(() => normalQuantile(bad)).toThrow(RangeError);
    expect(() => zForConfidence(1)).toThrow(/confidence/);
  });
});

describe('wilsonInterval', () => {
  // Newcombe (1998), Stat Med 17:857–872, table of methods: values from memory, recomputed with
  // Wilson's formula and matching to 4 decimals (check-values §7).
  it.each([
    [81, 263, 0.2553, 0.3662],
    [15, 148, 0.0624, 0.1605],
    [0, 20, 0, 0.1611],
    [1, 29, 0.0061, 0.1718],
  ])('gives %i/%i → %f–%f at 95% (Newcombe 1998, from memory, recomputed)', (x, n, lower, upper) => {
    const interval = wilsonInterval(x, n);
    expect(interval.estimate).toBeCloseTo(x / n, 12);
    expect(interval.lower).toBeCloseTo(lower, 4);
    expect(interval.upper).toBeCloseTo(upper, 4);
  });

  it.each([
    [4, 20, 0.0807, 0.416],
    [10, 100, 0.0552, 0.1744],
    [5, 25, 0.0886, 0.3913],
  ])('gives %i/%i → %f–%f (derived with Wilson 1927, JASA 22:209–212)', (x, n, lower, upper) => {
    const interval = wilsonInterval(x, n);
    expect(interval.lower).toBeCloseTo(lower, 4);
    expect(interval.upper).toBeCloseTo(upper, 4);
  });

  it('sits inside the exact Clopper–Pearson interval for 5/25, 0.068–0.407 (influentialpoints, after Conover 1999)', () => {
    const { lower, upper } = wilsonInterval(5, 25);
    expect(lower).toBeGreaterThan(0.068);
    expect(upper).toBeLessThan(0.407);
  });

  it('is exactly 0 at the bottom when nothing was found and exactly 1 at the top when everything was', () => {
    expect(wilsonInterval(0, 20).lower).toBe(0);
    expect(wilsonInterval(20, 20).upper).toBe(1);
    expect(wilsonInterval(20, 20).lower).toBeCloseTo(1 - 0.1611, 4);
  });

  it('widens with the confidence asked for', () => {
    const at90 = wilsonInterval(10, 100, 0.9);
    const at99 = wilsonInterval(10, 100, 0.99);
    expect(at99.upper - at99.lower).toBeGreaterThan(at90.upper - at90.lower);
  });

  it('rejects zero trials, more successes than trials, fractional counts and impossible confidence levels', () => {
    expect(() => wilsonInterval(0, 0)).toThrow(/trials must be at least 1/);
    expect(() => wilsonInterval(5, 4)).toThrow(/cannot exceed trials/);
    expect(() => wilsonInterval(1.5, 4)).toThrow(RangeError);
    expect(() => wilsonInterval(1, 4, 1)).toThrow(/confidence/);
    expect(() => wilsonInterval(-1, 4)).toThrow(RangeError);
  });
});
