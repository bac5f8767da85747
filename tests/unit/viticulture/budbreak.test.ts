import { describe, expect, it } from 'vitest';
import { budInjuryAdjustment, budbreakPercent, isWeakBudbreak, primaryBudKillPercent } from '@/lib/viticulture';

describe('budbreakPercent', () => {
  // Shoots from count nodes / count nodes retained × 100: the formula is from memory; the measure is
  // AWRI Technical Review 259 (Dixon, 2022) "% bud burst".
  it('is buds pushed over buds retained, as a percentage (from memory; AWRI TR 259 "% bud burst")', () => {
    expect(budbreakPercent(28, 15)).toBeCloseTo(53.571, 3);
    expect(budbreakPercent(40, 0)).toBe(0);
    expect(budbreakPercent(40, 40)).toBe(100);
  });

  it('rejects zero buds retained, more pushed than retained, and negative, fractional or missing counts', () => {
    expect(() => budbreakPercent(0, 0)).toThrow(/budsRetained must be at least 1/);
    expect(() => budbreakPercent(10, 11)).toThrow(/budsPushed \(11\) cannot exceed budsRetained \(10\)/);
    expect(() => budbreakPercent(-1, 0)).toThrow(RangeError);
    expect(() => budbreakPercent(10, 2.5)).toThrow(RangeError);
    expect(() => budbreakPercent(Number.NaN, 1)).toThrow(/got NaN/);
  });
});

describe('isWeakBudbreak', () => {
  // No published threshold exists (check-values §5), so only the behaviour around the setting is tested.
  it('is weak under 75% and not at it (settings.budbreak.weakBelowPercent: common practice, no source)', () => {
    expect(isWeakBudbreak(100, 74)).toBe(true);
    expect(isWeakBudbreak(100, 75)).toBe(false);
  });

  it("follows a block's own threshold", () => {
    expect(isWeakBudbreak(100, 85, { budbreak: { weakBelowPercent: 90 } })).toBe(true);
    expect(isWeakBudbreak(100, 85, { budbreak: { weakBelowPercent: 80 } })).toBe(false);
  });
});

describe('primaryBudKillPercent', () => {
  it.each([
    ['Cayuga White', 12],
    ['Chambourcin', 50],
    ['Norton', 0],
    ['Seyval Blanc', 9],
    ['Vidal Blanc', 5],
  ])('gives %s %i% on a 100-bud sample (Missouri State Fruit Experiment Station, "Assessing winter bud injury", 2014)', (_, dead) => {
    expect(primaryBudKillPercent(100, dead)).toBe(dead);
  });

  it('works on the 50–100 bud samples Cornell NNY asks for', () => {
    expect(primaryBudKillPercent(60, 21)).toBe(35);
  });

  it('rejects zero buds cut and more dead than cut', () => {
    expect(() => primaryBudKillPercent(0, 0)).toThrow(RangeError);
    expect(() => primaryBudKillPercent(50, 51)).toThrow(/primariesDead/);
  });
});

describe('budInjuryAdjustment (Cornell NNY Grape Update 2014 up to 50%; Purdue Facts for Fancy Fruit and the MSU table-grape guide above)', () => {
  it('leaves 35% more buds at 35% injury: a 40-bud target becomes 54', () => {
    expect(budInjuryAdjustment(40, 35)).toEqual({ buds: 54, advice: 'leave-extra' });
  });

  it('uses the linear rule, not one that replaces the dead buds (40 / 0.65 would give 62)', () => {
    expect(budInjuryAdjustment(40, 35).buds).not.toBe(Math.round(40 / 0.65));
  });

  it('leaves no extra buds under 20% injury', () => {
    expect(budInjuryAdjustment(40, 0)).toEqual({ buds: 40, advice: 'prune-normally' });
    expect(budInjuryAdjustment(40, 19.9)).toEqual({ buds: 40, advice: 'prune-normally' });
  });

  it('starts leaving extra at exactly 20% and still does at exactly 50%', () => {
    expect(budInjuryAdjustment(40, 20)).toEqual({ buds: 48, advice: 'leave-extra' });
    expect(budInjuryAdjustment(40, 50)).toEqual({ buds: 60, advice: 'leave-extra' });
  });

  it('advises minimal or delayed pruning above 50%, with no bud count (Purdue: ">50% bud damage- Minimally prune"; MSU: "greater than 50% ... delay pruning until after bud break")', () => {
    expect(budInjuryAdjustment(40, 50.1)).toEqual({ buds: null, advice: 'minimal-pruning' });
    expect(budInjuryAdjustment(40, 67)).toEqual({ buds: null, advice: 'minimal-pruning' });
    expect(budInjuryAdjustment(40, 100)).toEqual({ buds: null, advice: 'minimal-pruning' });
  });

  it('rounds to whole buds, half up', () => {
    expect(budInjuryAdjustment(30, 35).buds).toBe(41); // 40.5
    expect(budInjuryAdjustment(30, 21).buds).toBe(36); // 36.3
    expect(budInjuryAdjustment(50, 21).buds).toBe(61); // 60.5
    expect(budInjuryAdjustment(40.5, 0).buds).toBe(41);
  });

  it('moves its bands with the settings', () => {
    expect(budInjuryAdjustment(40, 15, { budInjury: { extraFromPercent: 15 } }).advice).toBe('leave-extra');
    // A block that follows Cornell's linear rule all the way to its 80% sets it.
    expect(budInjuryAdjustment(40, 60, { budInjury: { minimalAbovePercent: 80 } })).toEqual({ buds: 64, advice: 'leave-extra' });
  });

  it('rejects a negative target and a kill outside 0–100%', () => {
    expect(() => budInjuryAdjustment(-1, 10)).toThrow(/targetBuds/);
    expect(() => budInjuryAdjustment(40, 101)).toThrow(/primaryBudKillPercent/);
    expect(() => budInjuryAdjustment(40, Number.NaN)).toThrow(RangeError);
  });
});
