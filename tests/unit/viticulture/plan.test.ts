import { describe, expect, it } from 'vitest';
import { BALANCED_PRUNING_FORMULAS as F, DEFAULT_SETTINGS, PLAN_NOTE_CODES, planVine, type CaneInput } from '@/lib/viticulture';

const normal = (mm = 9.5): CaneInput => ({ baseDiameterMm: mm, longestInternodeMm: 60, exposure: 'sun', colourGood: true });
const code = (note: string) => note.split(':', 1)[0];

describe('planVine, cane pruning', () => {
  it('keeps two canes of 13 buds and a two-bud renewal spur per cane by default (common practice, no source)', () => {
    const plan = planVine({ trainingSystem: 'cane', canes: [normal(), normal(), normal()] });
    expect(plan).toEqual({
      keep: [0, 1],
      budsPerCane: [13, 13],
      renewalSpurs: 2,
      budsPerRenewalSpur: 2,
      totalBuds: 30,
      targetBuds: null,
      notes: [],
    });
  });

  it('ranks fruit canes first, then by closeness to 3/8 in, and never keeps a cane to remove', () => {
    const canes: CaneInput[] = [
      { baseDiameterMm: 9.5, injured: true }, // remove
      { baseDiameterMm: 9.5, exposure: 'shade' }, // if nothing better
      { baseDiameterMm: 12 }, // fruit cane, 2.5 mm from ideal
      { baseDiameterMm: 9.0 }, // fruit cane, 0.5 mm from ideal
    ];
    const plan = planVine({ trainingSystem: 'cane', canes, settings: { plan: { canesPerVine: 3 } } });
    expect(plan.keep).toEqual([3, 2, 1]);
    expect(plan.budsPerCane).toEqual([13, 17, 13]);
    expect(plan.notes.map(code)).toEqual(['second-choice-canes']);
  });

  it('approaches the 50-bud target of 3 lb of Concord prunings under 30 + 10 (West Virginia Dept. of Agriculture) as closely as normal canes allow', () => {
    const plan = planVine({ trainingSystem: 'cane', canes: [normal(), normal(), normal(), normal()], pruningWeight: 3, formula: F.concord });
    expect(plan.targetBuds).toBe(50);
    // Three canes of 12–14 plus three spurs give 42–48; four give 56–64: three come nearer.
    expect(plan).toMatchObject({ keep: [0, 1, 2], budsPerCane: [14, 14, 14], renewalSpurs: 3, totalBuds: 48 });
    expect(plan.notes.map(code)).toEqual(['below-target']);
  });

  it('meets that 50-bud target exactly when a kept cane is thicker and may carry more buds', () => {
    const vigorous = planVine({ trainingSystem: 'cane', canes: [normal(), normal(12), normal()], pruningWeight: 3, formula: F.concord });
    expect(vigorous).toMatchObject({ keep: [0, 2, 1], budsPerCane: [14, 13, 17], renewalSpurs: 3, totalBuds: 50, notes: [] });
  });

  it('counts renewal-spur buds toward the target and gives extra buds to the best canes first', () => {
    // 2 canes + 2 spurs: 24–28 + 4 buds covers a 31-bud target; 27 cane buds = 14 + 13.
    const plan = planVine({
      trainingSystem: 'cane',
      canes: [normal(9.0), normal(9.5)],
      pruningWeight: 31,
      formula: { firstUnitBuds: 1, perAdditionalUnitBuds: 1, unit: 'lb' },
    });
    expect(plan.targetBuds).toBe(31);
    expect(plan.keep).toEqual([1, 0]);
    expect(plan.budsPerCane).toEqual([14, 13]);
    expect(plan.totalBuds).toBe(31);
  });

  it('takes the pruning weight in kilograms and the formula from the settings when none is given (vinifera 20 + 20)', () => {
    const plan = planVine({ trainingSystem: 'cane', canes: [normal(), normal()], pruningWeight: 0.45359237 * 1.5, weightUnit: 'kg' });
    expect(plan.targetBuds).toBe(30);
    expect(plan.totalBuds).toBe(30);
  });

  it('says when the recommended buds per cane keep it below or above the target', () => {
    const heavy = planVine({ trainingSystem: 'cane', canes: [normal(), normal()], pruningWeight: 6, formula: F.vinifera });
    expect(heavy.targetBuds).toBe(120);
    expect(heavy.totalBuds).toBe(32);
    expect(heavy.notes.map(code)).toEqual(['below-target']);

    const light = planVine({ trainingSystem: 'cane', canes: [normal(), normal()], pruningWeight: 0.5, formula: F.vinifera });
    expect(light.targetBuds).toBe(10);
    expect(light.keep).toHaveLength(1);
    expect(light.totalBuds).toBe(14);
    expect(light.notes.map(code)).toEqual(['above-target']);
  });

  it('keeps up to settings.plan.maxCanesPerVine canes (four-cane Kniffin) while chasing a large target', () => {
    const canes = Array.from({ length: 6 }, () => normal());
    expect(planVine({ trainingSystem: 'cane', canes, pruningWeight: 4, formula: F.vinifera }).keep).toHaveLength(DEFAULT_SETTINGS.plan.maxCanesPerVine);
  });

  it('rounds renewal spurs up when the setting asks for one and a half per cane', () => {
    const plan = planVine({ trainingSystem: 'cane', canes: [normal(), normal()], settings: { plan: { renewalSpursPerCane: 1.5 } } });
    expect(plan.renewalSpurs).toBe(3);
    expect(plan.totalBuds).toBe(26 + 6);
  });

  it('says when there are fewer usable canes than wanted, or none', () => {
    expect(planVine({ trainingSystem: 'cane', canes: [normal()] }).notes.map(code)).toEqual(['fewer-canes-than-wanted']);
    const none = planVine({ trainingSystem: 'cane', canes: [{ baseDiameterMm: 3 }], pruningWeight: 2, formula: F.concord });
    expect(none).toMatchObject({ keep: [], budsPerCane: [], renewalSpurs: 0, totalBuds: 0, targetBuds: 40 });
    expect(none.notes.map(code)).toEqual(['no-usable-canes', 'below-target']);
    expect(none.notes.every((note) => PLAN_NOTE_CODES.includes(code(note) as never))).toBe(true);
  });
});

describe('planVine, spur pruning', () => {
  it('cuts kept canes to two-bud spurs with no separate renewal spurs (Oxford Companion, "spur pruning": "only two buds")', () => {
    const canes = Array.from({ length: 20 }, () => normal());
    const plan = planVine({ trainingSystem: 'spur', canes });
    expect(plan.keep).toHaveLength(12); // settings.plan.spursPerVine: common practice, no source
    expect(new Set(plan.budsPerCane)).toEqual(new Set([2]));
    expect(plan).toMatchObject({ renewalSpurs: 0, budsPerRenewalSpur: 0, totalBuds: 24 });
  });

  it('keeps target / 2 spurs for a balanced-pruning target', () => {
    const canes = Array.from({ length: 30 }, () => normal());
    const plan = planVine({ trainingSystem: 'spur', canes, pruningWeight: 2, formula: F.concord });
    expect(plan.targetBuds).toBe(40);
    expect(plan.keep).toHaveLength(20);
    expect(plan.totalBuds).toBe(40);
  });

  it('meets an odd target exactly: 41 buds is 19 two-bud spurs and one of three, not 21 spurs and 42 buds', () => {
    const canes = Array.from({ length: 30 }, () => normal());
    // 20 + 20 at 2.05 lb: 20 + 20 × 1.05 = 41.
    const plan = planVine({ trainingSystem: 'spur', canes, pruningWeight: 2.05, formula: F.vinifera });
    expect(plan.targetBuds).toBe(41);
    expect(plan.totalBuds).toBe(41);
    expect(plan.keep).toHaveLength(20);
    expect(plan.notes).toEqual([]);
  });

  it('keeps no more spurs than fit the cordon at one every 3 in (A. Klodd, UMN Extension: "one spur every 3-5 inches")', () => {
    const canes = Array.from({ length: 30 }, () => normal());
    // 1.2 m of cordon = 1200 / 76.2 = 15.7 → 15 spurs; 40 buds then need spurs of 2–3 buds.
    const plan = planVine({ trainingSystem: 'spur', canes, pruningWeight: 2, formula: F.concord, cordonLengthM: 1.2 });
    expect(plan.keep).toHaveLength(15);
    expect(plan.totalBuds).toBe(40);
    expect(Math.max(...plan.budsPerCane)).toBe(3);
    expect(plan.notes.map(code)).toEqual(['cordon-full']);
    // Without a cordon length nothing caps it.
    expect(planVine({ trainingSystem: 'spur', canes, pruningWeight: 2, formula: F.concord }).keep).toHaveLength(20);
    expect(() => planVine({ trainingSystem: 'spur', canes, cordonLengthM: 0 })).toThrow(/cordonLengthM/);
  });

  it('lengthens spurs up to settings.plan.maxBudsPerSpur when canes run short', () => {
    const plan = planVine({ trainingSystem: 'spur', canes: [normal(), normal()], pruningWeight: 1, formula: F.vinifera });
    expect(plan.budsPerCane).toEqual([4, 4]);
    expect(plan.notes.map(code)).toEqual(['fewer-canes-than-wanted', 'below-target']);
  });

  it('rejects an unknown training system', () => {
    expect(() => planVine({ trainingSystem: 'head' as never, canes: [] })).toThrow(/trainingSystem/);
  });
});
