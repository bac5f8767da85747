import { describe, expect, it } from 'vitest';
import { BALANCED_PRUNING_FORMULAS as F, balancedPruningBuds, checkBudLoad, ftToM } from '@/lib/viticulture';

// Ohio State, "2023 Grape Pruning Primer" (M. Smith): "approximately 4-6 buds per foot of vine spacing
// (e.g., if the vine spacing is 5-8', retain 20-50 buds per vine)".
describe('checkBudLoad', () => {
  it('gives the primer\'s 20–30 buds a vine at 5 ft and 32–48 at 8 ft spacing (its "20-50" spans both)', () => {
    expect(checkBudLoad(25, ftToM(5)).rangePerVine).toEqual({ min: 20, max: 30 });
    expect(checkBudLoad(40, ftToM(8)).rangePerVine).toEqual({ min: 32, max: 48 });
  });

  it('flags 20 + 20 at 4 lb: 80 buds is 16 per foot at 5 ft spacing, far over 6', () => {
    const buds = balancedPruningBuds(4, F.vinifera);
    expect(buds).toBe(80);
    const check = checkBudLoad(buds, ftToM(5));
    expect(check.budsPerFt).toBeCloseTo(16, 12);
    expect(check.budsPerM).toBeCloseTo(16 / 0.3048, 9);
    expect(check.reading).toBe('over');
  });

  it('reads both ends of 4–6 a foot as within, and under 4 as under', () => {
    expect(checkBudLoad(30, ftToM(5)).reading).toBe('within');
    expect(checkBudLoad(20, ftToM(5)).reading).toBe('within');
    expect(checkBudLoad(19, ftToM(5)).reading).toBe('under');
    expect(checkBudLoad(31, ftToM(5)).reading).toBe('over');
  });

  it("follows a block's own range", () => {
    expect(checkBudLoad(40, ftToM(5), { budLoad: { maxBudsPerFt: 8 } }).reading).toBe('within');
  });

  it('rejects a zero spacing', () => {
    expect(() => checkBudLoad(30, 0)).toThrow(/vineSpacingM/);
  });
});
