// Invariants checked over many generated inputs (fast-check) rather than picked examples.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  BALANCED_PRUNING_FORMULAS,
  GRAPE_TYPES,
  balancedPruningBuds,
  budInjuryAdjustment,
  budbreakPercent,
  ftToM,
  inToMm,
  kgToLb,
  lbToKg,
  mToFt,
  mmToIn,
  planVine,
  recommendedBudsPerCane,
  samplingPlan,
  wilsonInterval,
} from '@/lib/viticulture';

const size = fc.double({ min: 0, max: 1e6, noNaN: true, noDefaultInfinity: true });
const confidence = fc.constantFrom(0.8, 0.9, 0.95, 0.99, 0.999);
const counts = fc.integer({ min: 1, max: 5000 }).chain((n) => fc.tuple(fc.integer({ min: 0, max: n }), fc.constant(n)));

describe('invariants', () => {
  it('Wilson intervals contain the estimate and stay within [0, 1]', () => {
    fc.assert(
      fc.property(counts, confidence, ([x, n], c) => {
        const { estimate, lower, upper } = wilsonInterval(x, n, c);
        expect(0).toBeLessThanOrEqual(lower);
        expect(lower).toBeLessThanOrEqual(estimate);
        expect(estimate).toBeLessThanOrEqual(upper);
        expect(upper).toBeLessThanOrEqual(1);
      }),
    );
  });

  it('Wilson intervals narrow as trials grow at the same proportion', () => {
    fc.assert(
      fc.property(counts, fc.integer({ min: 2, max: 50 }), confidence, ([x, n], k, c) => {
        const few = wilsonInterval(x, n, c);
        const many = wilsonInterval(x * k, n * k, c);
        expect(many.upper - many.lower).toBeLessThan(few.upper - few.lower);
      }),
    );
  });

  it('more prunings never mean fewer buds, in either unit, for every formula', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...GRAPE_TYPES),
        fc.double({ min: 0, max: 20, noNaN: true }),
        fc.double({ min: 0, max: 5, noNaN: true }),
        fc.constantFrom('lb' as const, 'kg' as const),
        (type, weight, extra, unit) => {
          const formula = BALANCED_PRUNING_FORMULAS[type];
          const buds = balancedPruningBuds(weight, formula, unit);
          expect(Number.isInteger(buds)).toBe(true);
          expect(balancedPruningBuds(weight + extra, formula, unit)).toBeGreaterThanOrEqual(buds);
        },
      ),
    );
  });

  it('a thicker cane never gets fewer recommended buds, up to the 1/2 in bull cane (eXtension), which gets no extra', () => {
    const bull = 12.7;
    fc.assert(
      fc.property(fc.double({ min: 1, max: bull, noNaN: true }), fc.double({ min: 0, max: 10, noNaN: true }), (mm, extra) => {
        const thin = recommendedBudsPerCane(mm);
        const thick = recommendedBudsPerCane(Math.min(bull, mm + extra));
        expect(recommendedBudsPerCane(bull + extra + 0.01)).toEqual({ min: 12, max: 14 });
        expect(thick.min).toBeGreaterThanOrEqual(thin.min);
        expect(thick.max).toBeGreaterThanOrEqual(thin.max);
      }),
    );
  });

  it('budbreak stays between 0 and 100', () => {
    fc.assert(
      fc.property(counts, ([pushed, retained]) => {
        const percent = budbreakPercent(retained, pushed);
        expect(percent).toBeGreaterThanOrEqual(0);
        expect(percent).toBeLessThanOrEqual(100);
      }),
    );
  });

  it('more winter injury never means fewer buds left', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 200 }),
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 100, noNaN: true }),
        (target, a, b) => {
          const [low, high] = a <= b ? [a, b] : [b, a];
          const [h, l] = [budInjuryAdjustment(target, high), budInjuryAdjustment(target, low)];
          // Past the minimal-pruning limit there is no count to compare: the advice is not to prune to one.
          if (h.buds !== null && l.buds !== null) expect(h.buds).toBeGreaterThanOrEqual(l.buds);
          if (l.buds === null) expect(h.buds).toBeNull();
        },
      ),
    );
  });

  it('conversions round-trip', () => {
    fc.assert(
      fc.property(size, (x) => {
        const close = (y: number) => expect(Math.abs(y - x)).toBeLessThanOrEqual(1e-12 * Math.max(1, x));
        close(mmToIn(inToMm(x)));
        close(inToMm(mmToIn(x)));
        close(kgToLb(lbToKg(x)));
        close(lbToKg(kgToLb(x)));
        close(mToFt(ftToM(x)));
        close(ftToM(mToFt(x)));
      }),
    );
  });

  it('a vine plan keeps distinct canes, never one to remove, and adds its buds up right', () => {
    const cane = fc.record({
      baseDiameterMm: fc.double({ min: 2, max: 20, noNaN: true }),
      longestInternodeMm: fc.option(fc.double({ min: 20, max: 200, noNaN: true }), { nil: undefined }),
      injured: fc.option(fc.boolean(), { nil: undefined }),
    });
    fc.assert(
      fc.property(
        fc.constantFrom('cane' as const, 'spur' as const),
        fc.array(cane, { maxLength: 25 }),
        fc.option(fc.double({ min: 0, max: 6, noNaN: true }), { nil: undefined }),
        (trainingSystem, canes, pruningWeight) => {
          const plan = planVine({ trainingSystem, canes, pruningWeight });
          expect(new Set(plan.keep).size).toBe(plan.keep.length);
          expect(plan.keep.every((i) => i >= 0 && i < canes.length && canes[i]!.injured !== true)).toBe(true);
          expect(plan.budsPerCane).toHaveLength(plan.keep.length);
          const spurBuds = plan.renewalSpurs * plan.budsPerRenewalSpur;
          expect(plan.totalBuds).toBe(plan.budsPerCane.reduce((a, b) => a + b, 0) + spurBuds);
        },
      ),
    );
  });

  const layout = fc.record({
    rowCount: fc.integer({ min: 0, max: 25 }),
    firstRow: fc.integer({ min: 1, max: 5 }),
    vinesPerRow: fc.integer({ min: 0, max: 40 }),
    skip: fc.array(fc.record({ row: fc.integer({ min: 0, max: 30 }), position: fc.integer({ min: 0, max: 45 }) }), { maxLength: 30 }),
  });
  const options = fc.record({
    count: fc.integer({ min: 0, max: 1200 }),
    seed: fc.integer(),
    edgeShare: fc.option(fc.double({ min: 0, max: 1, noNaN: true }), { nil: undefined }),
    edgeRows: fc.option(fc.integer({ min: 0, max: 4 }), { nil: undefined }),
    avoidRowEnds: fc.option(fc.integer({ min: 0, max: 5 }), { nil: undefined }),
  });

  it('a sampling plan never repeats a vine, stays inside the block, avoids skipped vines and row ends, and is deterministic', () => {
    fc.assert(
      fc.property(layout, options, (l, o) => {
        const plan = samplingPlan(l, o);
        const keys = plan.map((v) => `${v.row}:${v.position}`);
        expect(new Set(keys).size).toBe(plan.length);
        const skipped = new Set(l.skip.map((v) => `${v.row}:${v.position}`));
        const ends = o.avoidRowEnds ?? 0;
        let available = 0;
        for (let row = l.firstRow; row < l.firstRow + l.rowCount; row++) {
          for (let p = 1 + ends; p <= l.vinesPerRow - ends; p++) if (!skipped.has(`${row}:${p}`)) available++;
        }
        expect(plan).toHaveLength(Math.min(o.count, available));
        for (const v of plan) {
          expect(v.row).toBeGreaterThanOrEqual(l.firstRow);
          expect(v.row).toBeLessThan(l.firstRow + l.rowCount);
          expect(v.position).toBeGreaterThan(ends);
          expect(v.position).toBeLessThanOrEqual(l.vinesPerRow - ends);
          expect(skipped.has(`${v.row}:${v.position}`)).toBe(false);
        }
        expect(samplingPlan(l, o)).toEqual(plan);
      }),
      { numRuns: 150 },
    );
  });
});
