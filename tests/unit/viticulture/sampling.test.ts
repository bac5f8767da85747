import { describe, expect, it } from 'vitest';
import {
  coefficientOfVariationPercent,
  detectionSampleSize,
  sampleSizeForMean,
  sampleSizeForProportion,
  samplingPlan,
  type VineAddress,
} from '@/lib/viticulture';

describe('sampleSizeForMean (Wolpert & Vilas, "Estimating vineyard yields", AJEV Technical Brief, 1992)', () => {
  it('samples 35 vines for a mean yield within ±10% when vine yields vary with a CV of 30%: (1.96 × 30 / 10)² = 34.6', () => {
    expect(sampleSizeForMean(30, 10)).toBe(35);
  });

  it('grows with the spread and shrinks with the margin allowed', () => {
    // Strickland's 1932 Rutherglen uniformity trial had a CV of 43.4% (agridat documentation): (1.96 × 43.4 / 10)² = 72.4.
    expect(sampleSizeForMean(43.4, 10)).toBe(73);
    // ±5% needs four times the vines: (1.96 × 30 / 5)² = 138.3.
    expect(sampleSizeForMean(30, 5)).toBe(139);
  });

  it('applies the finite-population correction for a small block, and never asks for more vines than it has', () => {
    // 34.57 / (1 + 33.57 / 100) = 25.9 → 26.
    expect(sampleSizeForMean(30, 10, 0.95, 100)).toBe(26);
    expect(sampleSizeForMean(200, 1, 0.95, 40)).toBeLessThanOrEqual(40);
  });

  it('is not the proportion formula: 800 vines need 260 for a proportion but 34 for a CV-30% mean', () => {
    expect(sampleSizeForProportion(800)).toBe(260);
    expect(sampleSizeForMean(30, 10, 0.95, 800)).toBe(34);
  });

  it('rejects a zero CV or margin', () => {
    expect(() => sampleSizeForMean(0)).toThrow(/cvPercent/);
    expect(() => sampleSizeForMean(30, 0)).toThrow(/marginPercent/);
  });
});

describe('coefficientOfVariationPercent', () => {
  it('is the sample standard deviation (n − 1) over the mean: 2, 4, 4, 4, 5, 5, 7, 9 → 2.138 / 5 = 42.76%', () => {
    expect(coefficientOfVariationPercent([2, 4, 4, 4, 5, 5, 7, 9])).toBeCloseTo(42.762, 3);
  });

  it('needs two values and a positive mean', () => {
    expect(() => coefficientOfVariationPercent([3])).toThrow(RangeError);
    expect(() => coefficientOfVariationPercent([0, 0])).toThrow(/mean/);
  });
});

describe('sampleSizeForProportion', () => {
  it('samples 260 of about 800 vines for a 5% error (WSU, M. Olmstead, "Yield Estimation", 2006)', () => {
    expect(sampleSizeForProportion(800)).toBe(260);
  });

  // Krejcie & Morgan (1970), "Determining sample size for research activities" (from memory; the
  // values are recomputed from their formula with χ² = 3.841, P = 0.5, d = 0.05 in check-values §7).
  it.each([
    [100, 80],
    [500, 217],
    [1000, 278],
    [10000, 370],
  ])("samples %i vines → %i, rounded to the nearest vine as Krejcie & Morgan's table is (from memory)", (n, s) => {
    expect(sampleSizeForProportion(n)).toBe(s);
  });

  it('never asks for more vines than the block has, and nothing of an empty block', () => {
    expect(sampleSizeForProportion(10)).toBe(10);
    expect(sampleSizeForProportion(1)).toBe(1);
    expect(sampleSizeForProportion(0)).toBe(0);
  });

  it('asks for more vines for a tighter margin or a higher confidence', () => {
    expect(sampleSizeForProportion(10000, 0.03)).toBeGreaterThan(sampleSizeForProportion(10000, 0.05));
    expect(sampleSizeForProportion(10000, 0.05, 0.99)).toBeGreaterThan(sampleSizeForProportion(10000, 0.05, 0.95));
  });

  it('rejects fractional or negative populations and margins outside (0, 1)', () => {
    expect(() => sampleSizeForProportion(-5)).toThrow(/populationVines/);
    expect(() => sampleSizeForProportion(10.5)).toThrow(RangeError);
    expect(() => sampleSizeForProportion(100, 0)).toThrow(/marginOfError/);
    expect(() => sampleSizeForProportion(100, 0.05, 1.5)).toThrow(/confidence/);
  });
});

describe('detectionSampleSize (McSorley & Littell 1993, Nematropica 23:177)', () => {
  it('needs 59 vines to detect a 5% problem 95% of the time and 90 for 99%', () => {
    expect(detectionSampleSize(0.05)).toBe(59);
    expect(detectionSampleSize(0.05, 0.99)).toBe(90);
  });

  it('needs 299 and 459 vines for a 1% problem, which the paper rounds up to 300 and 500', () => {
    expect(detectionSampleSize(0.01)).toBe(299);
    expect(detectionSampleSize(0.01, 0.99)).toBe(459);
  });

  it('does not round an exact whole answer up: half the vines affected, 75% confidence → 2', () => {
    expect(detectionSampleSize(0.5, 0.75)).toBe(2);
  });

  it('needs one vine when every vine is affected and refuses a prevalence of 0', () => {
    expect(detectionSampleSize(1)).toBe(1);
    expect(() => detectionSampleSize(0)).toThrow(/prevalence must be greater than 0/);
    expect(() => detectionSampleSize(1.2)).toThrow(RangeError);
    expect(() => detectionSampleSize(0.05, 1)).toThrow(RangeError);
  });
});

const keyOf = (v: VineAddress) => `${v.row}:${v.position}`;

describe('samplingPlan', () => {
  const block = { rowCount: 20, vinesPerRow: 50 } as const;

  it('returns the count asked for, all distinct, inside the block', () => {
    const plan = samplingPlan(block, { count: 40, seed: 7 });
    expect(plan).toHaveLength(40);
    expect(new Set(plan.map(keyOf)).size).toBe(40);
    for (const v of plan) {
      expect(v.row).toBeGreaterThanOrEqual(1);
      expect(v.row).toBeLessThanOrEqual(20);
      expect(v.position).toBeGreaterThanOrEqual(1);
      expect(v.position).toBeLessThanOrEqual(50);
    }
  });

  it('gives the same plan for the same seed and a different one for another seed', () => {
    expect(samplingPlan(block, { count: 30, seed: 99 })).toEqual(samplingPlan(block, { count: 30, seed: 99 }));
    expect(samplingPlan(block, { count: 30, seed: 99 })).not.toEqual(samplingPlan(block, { count: 30, seed: 100 }));
  });

  it('spreads the sample over all four quadrants of the block', () => {
    const plan = samplingPlan(block, { count: 8, seed: 3 });
    const quadrants = new Set(plan.map((v) => `${v.row <= 10 ? 'near' : 'far'}-${v.position <= 25 ? 'left' : 'right'}`));
    expect(quadrants.size).toBe(4);
  });

  it('orders the walk serpentine: rows ascending, direction alternating between visited rows', () => {
    const plan = samplingPlan(block, { count: 60, seed: 11 });
    const rows = [...new Set(plan.map((v) => v.row))];
    expect(rows).toEqual([...rows].sort((a, b) => a - b));
    rows.forEach((row, i) => {
      const positions = plan.filter((v) => v.row === row).map((v) => v.position);
      const sorted = [...positions].sort((a, b) => a - b);
      expect(positions).toEqual(i % 2 === 0 ? sorted : sorted.reverse());
    });
  });

  it('draws edge rows in proportion by default, only edge rows at edgeShare 1 and none at 0', () => {
    const isEdge = (v: VineAddress) => v.row === 1 || v.row === 20;
    expect(samplingPlan(block, { count: 100, seed: 5 }).filter(isEdge)).toHaveLength(10);
    expect(samplingPlan(block, { count: 30, seed: 5, edgeShare: 1 }).every(isEdge)).toBe(true);
    expect(samplingPlan(block, { count: 30, seed: 5, edgeShare: 0 }).some(isEdge)).toBe(false);
    expect(samplingPlan(block, { count: 30, seed: 5, edgeShare: 0.5, edgeRows: 2 }).filter((v) => v.row <= 2 || v.row >= 19)).toHaveLength(15);
  });

  it('tops up from the other rows when edge rows cannot supply the share asked for', () => {
    const plan = samplingPlan(block, { count: 150, seed: 5, edgeShare: 1 });
    expect(plan).toHaveLength(150);
    expect(plan.filter((v) => v.row === 1 || v.row === 20)).toHaveLength(100);
  });

  it('keeps a few vines in from the row ends when asked (UC IPM: "a few vines in from row ends")', () => {
    const plan = samplingPlan(block, { count: 200, seed: 1, avoidRowEnds: 3 });
    expect(plan.every((v) => v.position > 3 && v.position <= 47)).toBe(true);
  });

  it('never offers a skipped (missing) vine', () => {
    const skip = Array.from({ length: 25 }, (_, i) => ({ row: 4, position: i + 1 }));
    const plan = samplingPlan({ ...block, skip }, { count: 500, seed: 2 });
    expect(plan.some((v) => v.row === 4 && v.position <= 25)).toBe(false);
  });

  it('returns every available vine, in walking order, when asked for as many or more', () => {
    const small = { rows: [3, 5], vinesPerRow: { 3: 3, 5: 2 }, skip: [{ row: 3, position: 2 }] };
    const expected = [
      { row: 3, position: 1 },
      { row: 3, position: 3 },
      { row: 5, position: 2 },
      { row: 5, position: 1 },
    ];
    expect(samplingPlan(small, { count: 4, seed: 0 })).toEqual(expected);
    expect(samplingPlan(small, { count: 1000, seed: 0 })).toEqual(expected);
  });

  it('takes rows as a list, a count from firstRow, and vines per row as a number, a record or a Map', () => {
    const fromList = samplingPlan({ rows: [12, 10, 11], vinesPerRow: 4 }, { count: 12, seed: 0 });
    expect(new Set(fromList.map((v) => v.row))).toEqual(new Set([10, 11, 12]));
    const counted = samplingPlan(
      {
        rowCount: 3,
        firstRow: 10,
        vinesPerRow: new Map([
          [10, 1],
          [11, 2],
          [12, 3],
        ]),
      },
      { count: 6, seed: 0 },
    );
    expect(counted).toHaveLength(6);
    expect(counted.filter((v) => v.row === 12)).toHaveLength(3);
    expect(samplingPlan({ rowCount: 0, vinesPerRow: 10 }, { count: 5, seed: 0 })).toEqual([]);
    expect(samplingPlan(block, { count: 0, seed: 0 })).toEqual([]);
  });

  it('rejects layouts and options it cannot honour', () => {
    expect(() => samplingPlan({ rows: [1, 1], vinesPerRow: 5 }, { count: 1, seed: 0 })).toThrow(/repeat/);
    expect(() => samplingPlan({ rows: [1], rowCount: 1, vinesPerRow: 5 } as never, { count: 1, seed: 0 })).toThrow(/either rows or rowCount/);
    expect(() => samplingPlan({ rows: [1, 2], vinesPerRow: { 1: 5 } }, { count: 1, seed: 0 })).toThrow(/no entry for row 2/);
    expect(() => samplingPlan({ rowCount: 2, vinesPerRow: -1 }, { count: 1, seed: 0 })).toThrow(RangeError);
    expect(() => samplingPlan(block, { count: -1, seed: 0 })).toThrow(/count/);
    expect(() => samplingPlan(block, { count: 1, seed: 1.5 })).toThrow(/seed/);
    expect(() => samplingPlan(block, { count: 1, seed: 0, edgeShare: 2 })).toThrow(/edgeShare/);
    expect(() => samplingPlan(block, { count: 1, seed: 0, avoidRowEnds: -1 })).toThrow(/avoidRowEnds/);
  });
});
