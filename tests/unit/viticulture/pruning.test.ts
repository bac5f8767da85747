import { describe, expect, it } from 'vitest';
import { BALANCED_PRUNING_FORMULAS as F, GRAPE_TYPES, balancedPruningBuds, lbToKg } from '@/lib/viticulture';

describe('balanced pruning formulas', () => {
  it('carry the rows of Ohio State\'s "2023 Grape Pruning Primer" (M. Smith, 2023), Table 1', () => {
    expect(F.american).toEqual({ firstUnitBuds: 30, perAdditionalUnitBuds: 10, unit: 'lb' });
    expect(F['french-hybrid']).toEqual({ firstUnitBuds: 20, perAdditionalUnitBuds: 10, unit: 'lb' });
    expect(F['new-hybrid']).toEqual({ firstUnitBuds: 20, perAdditionalUnitBuds: 20, unit: 'lb' });
    expect(F['seedless-table']).toEqual({ firstUnitBuds: 30, perAdditionalUnitBuds: 10, unit: 'lb' });
    expect(F.vinifera).toEqual({ firstUnitBuds: 20, perAdditionalUnitBuds: 20, unit: 'lb' });
  });

  it('gives Concord 30 + 10 (T. Bates, Cornell LERGP, "Vine Size, Pruning Severity, and Vine Balance")', () => {
    expect(F.concord).toEqual({ firstUnitBuds: 30, perAdditionalUnitBuds: 10, unit: 'lb' });
  });

  it('gives Catawba 30 + 10: "Using the 30 + 10 pruning formula recommended for Catwaba" (Missouri State Fruit Experiment Station, "Grape pruning begins", 8 Nov 2012)', () => {
    expect(F.catawba).toEqual({ firstUnitBuds: 30, perAdditionalUnitBuds: 10, unit: 'lb' });
    // Their 2009 post: a 2.55 lb average vine "translates to about 45 buds" (30 + 10 gives 45.5; 25 + 10 would give 40.5).
    expect(balancedPruningBuds(2.55, F.catawba)).toBe(45);
  });

  it('gives the remembered cultivar rows (from memory: Niagara 25 + 10, Delaware 20 + 10, large-cluster hybrids 10 + 10)', () => {
    expect([F.niagara, F.delaware, F['hybrid-small-cluster'], F['hybrid-large-cluster']].map((f) => [f.firstUnitBuds, f.perAdditionalUnitBuds])).toEqual([
      [25, 10],
      [20, 10],
      [20, 10],
      [10, 10],
    ]);
  });

  it('lists every grape type once and cannot be changed at run time', () => {
    expect(GRAPE_TYPES).toEqual(
      expect.arrayContaining(['concord', 'niagara', 'catawba', 'delaware', 'hybrid-small-cluster', 'hybrid-large-cluster', 'vinifera']),
    );
    expect(Object.isFrozen(F)).toBe(true);
    expect(Object.isFrozen(F.concord)).toBe(true);
  });
});

describe('balancedPruningBuds', () => {
  it('keeps 50 buds for 3 lb of prunings under 30 + 10 (West Virginia Dept. of Agriculture, "Growing Grapes in WV")', () => {
    expect(balancedPruningBuds(3, F.concord)).toBe(50);
  });

  it('keeps 40 buds for 2 lb under 20 + 20 (grower blog cooksplace.us, "Pruning 2013 part 2"; low authority)', () => {
    expect(balancedPruningBuds(2, F.vinifera)).toBe(40);
  });

  it('rounds down: 2.55 lb under 30 + 10 is 45.5 and gives 45, as Missouri State Fruit Experiment Station\'s "about 45" (2009)', () => {
    expect(balancedPruningBuds(2.55, F.concord)).toBe(45);
  });

  // Derived in check-values §1 from the formulas (Ohio State 2023 primer; 25 + 10 and 10 + 10 from memory).
  it.each([
    [1, 30, 25, 20, 10, 20],
    [2, 40, 35, 30, 20, 40],
    [2.5, 45, 40, 35, 25, 50],
    [3, 50, 45, 40, 30, 60],
    [4, 60, 55, 50, 40, 80],
  ])('at %f lb gives %i / %i / %i / %i / %i buds for 30+10, 25+10, 20+10, 10+10, 20+20', (lb, a, b, c, d, e) => {
    expect(balancedPruningBuds(lb, F.concord)).toBe(a);
    expect(balancedPruningBuds(lb, F.niagara)).toBe(b);
    expect(balancedPruningBuds(lb, F['hybrid-small-cluster'])).toBe(c);
    expect(balancedPruningBuds(lb, F['hybrid-large-cluster'])).toBe(d);
    expect(balancedPruningBuds(lb, F.vinifera)).toBe(e);
  });

  it("converts kilograms to the formula's pounds: 1.1339809 kg (2.5 lb) gives 45 under 30 + 10 (metric form, 22.046 buds per extra kg)", () => {
    expect(balancedPruningBuds(1.1339809, F.concord, 'kg')).toBe(45);
    expect(balancedPruningBuds(lbToKg(3), F.concord, 'kg')).toBe(50);
    // One extra kilogram above the first pound adds 10 / 0.45359237 = 22.046 buds.
    expect(balancedPruningBuds(lbToKg(1) + 1, F.concord, 'kg')).toBe(52);
  });

  it('applies a per-kilogram formula to a weight in pounds by converting the weight to kilograms', () => {
    const perKg = { firstUnitBuds: 40, perAdditionalUnitBuds: 20, unit: 'kg' } as const;
    expect(balancedPruningBuds(2, perKg, 'kg')).toBe(60);
    expect(balancedPruningBuds(2 / 0.45359237, perKg, 'lb')).toBe(60);
  });

  it('scales the first-unit allowance down for vines under one unit, meeting the formula at exactly one unit', () => {
    expect(balancedPruningBuds(0.5, F.concord)).toBe(15);
    expect(balancedPruningBuds(0.99, F.concord)).toBe(29);
    expect(balancedPruningBuds(1, F.concord)).toBe(30);
    expect(balancedPruningBuds(0, F.concord)).toBe(0);
  });

  it('rejects negative or non-numeric weights, a bad unit and a malformed formula', () => {
    expect(() => balancedPruningBuds(-1, F.concord)).toThrow(/pruningWeight/);
    expect(() => balancedPruningBuds(Number.NaN, F.concord)).toThrow(RangeError);
    expect(() => balancedPruningBuds(2, F.concord, 'oz' as never)).toThrow(RangeError);
    expect(() => balancedPruningBuds(2, { firstUnitBuds: -30, perAdditionalUnitBuds: 10, unit: 'lb' })).toThrow(RangeError);
    expect(() => balancedPruningBuds(2, null as never)).toThrow(RangeError);
  });
});
