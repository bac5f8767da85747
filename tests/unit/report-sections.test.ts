import { describe, expect, it } from 'vitest';
import { buildBlockReport, type BlockReportInput, type MeasuredObservation } from '@/lib/reports/block-report';
import { ravazWorking } from '@/lib/reports/block/balance';
import { adjustForBudInjury, killWorking } from '@/lib/reports/block/bud-injury';
import { targetWorking } from '@/lib/reports/block/bud-load';
import { budbreakWorking } from '@/lib/reports/block/budbreak';
import { measuredYieldSpread } from '@/lib/reports/block/crop';
import { shareWorking } from '@/lib/reports/block/common';
import { SOURCES } from '@/lib/reports/block/sources';
import { cropEstimate, labourEstimate, labourWorking } from '@/lib/reports/estimates';
import { BALANCED_PRUNING_FORMULAS, estimatePruningLabour, wilsonInterval } from '@/lib/viticulture';
import { codeWords, stringsIn } from '../helpers/code-words';

const LB = 0.45359237;
const FT = 0.3048;

const obs = (row: number, position: number, kind: MeasuredObservation['kind'], data: Record<string, unknown>, day = '2024-04-20'): MeasuredObservation => ({
  row,
  position,
  kind,
  data,
  observedAt: `${day}T09:00:00.000Z`,
});

function input(over: Partial<BlockReportInput> = {}): BlockReportInput {
  return {
    block: {
      id: 'b1',
      name: 'Test',
      variety: 'Noir',
      clone: null,
      rootstock: null,
      plantingYear: null,
      trainingSystem: 'cane',
      rowSpacingM: 2.5,
      vineSpacingM: 5 * FT,
      rowCount: 1,
      vinesPerRow: 10,
      vinesPerPanel: null,
    },
    season: 2024,
    units: 'metric',
    slots: { planted: 10, replant: 0, missing: 0, dead: 0, bearingReplants: 0 },
    kindRows: [
      { row: 1, kind: 'trunk-injury', recorded: 2, affected: 1, observations: 2 },
      { row: 1, kind: 'pruning-record', recorded: 2, affected: 2, observations: 2 },
      { row: 1, kind: 'pruning-check', recorded: 2, affected: 1, observations: 2 },
    ],
    scoutedRows: [{ row: 1, vines: 8, slots: 10 }],
    observations: 10,
    measured: [
      obs(1, 1, 'weak-budbreak', { budsRetained: 28, budsPushed: 21 }),
      obs(1, 2, 'weak-budbreak', { budsRetained: 28, budsPushed: 27 }),
      obs(1, 1, 'pruning-record', { canesKept: 2, budsPerCane: 20, renewalSpurs: 2, pruningWeightKg: 3 * LB }, '2024-01-20'),
      obs(1, 2, 'pruning-record', { canesKept: 2, budsPerCane: 10, renewalSpurs: 1 }, '2024-01-20'),
      obs(1, 3, 'pruning-check', { prunedBy: 'u1', canesKept: 2, budsOnCanes: 24, renewalSpurs: 2, budTarget: 28 }, '2024-01-22'),
      obs(1, 4, 'pruning-check', { prunedBy: 'u2', canesKept: 3, budsOnCanes: 36, renewalSpurs: 0, budTarget: 28 }, '2024-01-22'),
      obs(1, 5, 'cane-diameter', { diameterMm: 9, exposure: 'sun', colourGood: true }, '2024-01-20'),
      obs(1, 6, 'bud-injury', { budsCut: 20, primariesDead: 7 }, '2024-01-05'),
    ],
    measurements: [
      { kind: 'yield', season: 2024, row: 1, position: 1, vines: 1, weightKg: 9.8, clusters: 70 },
      { kind: 'pruning-weight', season: 2025, row: 1, position: 1, vines: 1, weightKg: 1.3, clusters: null },
    ],
    recordedWeights: [],
    replant: [],
    tasks: [],
    options: { grapeType: 'concord' },
    ...over,
  };
}

describe('the block report in words', () => {
  it('works out pruning labour as a manager reads it (the issue’s own example, and Cornell: 1 min a vine at 807 vines an acre is 13.5 h)', () => {
    expect(labourWorking(1386, 1.75, 25)).toBe('1,386 vines × 1.75 min = 40 h; at 25 an hour, 1,011');
    // Martinson & Vanden Heuvel, Cornell, "Training systems and Labor": 13.5 hours an acre.
    // Their 13.5 is rounded: 807 ÷ 60 = 13.45.
    expect(Math.abs(estimatePruningLabour({ vines: 807, minutesPerVine: 1, hourlyCost: 20 }).hours - 13.5)).toBeLessThanOrEqual(0.05 + 1e-9);
    expect(labourWorking(807, 1, 20)).toBe('807 vines × 1 min = 13 h; at 20 an hour, 269');
    const v = (value: number) => ({ value, source: 'entered', defaultValue: null, defaultSource: '' });
    expect(labourEstimate({ vines: 807, trainingSystem: 'spur', areaM2: 4046.8564224 }, { minutesPerVine: v(1), hourlyCost: v(20) }).how).toBe(
      '807 vines × 1 min = 13 h; at 20 an hour, 269',
    );
  });

  it('reads the Ravaz index with its working (AJEV, the Oakville table: 9.8 kg on 1.30 kg of prunings is 7.5)', () => {
    expect(ravazWorking(9.8, 1.3, { underBelow: 5, overAbove: 10 })).toBe(
      '9.8 kg of fruit a vine ÷ 1.3 kg of prunings a vine = 7.5; between 5 and 10 reads as balanced, so this is balanced',
    );
    // Concord-type grapes read against 10–20 (Bates, Cornell LERGP, "Vine Size: Magic Number 15"): 7.5 is under-cropped there.
    const r = buildBlockReport(input()).ravaz!;
    expect(r.index.value).toBeCloseTo(9.8 / 1.3, 12);
    expect(r.index.how).toMatch(/= 7\.5; between 10 and 20 reads as balanced, so this is under-cropped \(more wood than fruit\)$/);
    expect(r.index.source).toBe(SOURCES.ravazConcord);
  });

  it('works out the balanced-pruning target (West Virginia Dept. of Agriculture: 3 lb on 30 + 10 is 50 buds; Missouri State: 2.55 lb is "about 45")', () => {
    const concord = BALANCED_PRUNING_FORMULAS.concord;
    expect(targetWorking(3 * LB, concord)).toBe('1.36 kg of prunings is 3 lb: 30 + 10 × 2 = 50 buds (rounded down)');
    expect(targetWorking(2.55 * LB, concord)).toBe('1.16 kg of prunings is 2.55 lb: 30 + 10 × 1.55 = 45 buds (rounded down)');
    const l = buildBlockReport(input()).budLoad!;
    expect(l.meanTarget!.how).toMatch(
      /^Each weighed vine's target is 30 buds for the first pound of prunings and 10 for each further pound; for example 1\.36 kg of prunings is 3 lb: 30 \+ 10 × 2 = 50 buds/,
    );
    expect(l.meanTarget!.source).toMatch(/Ohio State University, "2023 Grape Pruning Primer"/);
  });

  it('says what the pruners kept: canes, buds on them and renewal spurs, and the buds a vine', () => {
    const l = buildBlockReport(input()).budLoad!;
    // 2 × 20 + 2 spurs × 2 = 44; 2 × 10 + 1 × 2 = 22 (the check's rule: 2 buds a renewal spur).
    expect(l.kept).toEqual({ canes: 2, budsPerCane: 15, renewalSpurs: 1.5, budsPerRenewalSpur: 2 });
    expect(l.meanKept.how).toBe(
      'On each vine: canes kept × buds on each cane + renewal spurs × 2 buds. On average 2 canes × 15 buds + 1.5 renewal spurs × 2. Over the block: 66 buds ÷ 2 vines = 33 buds a vine',
    );
  });

  it('reads the bud load per foot of row (Ohio State 2023 primer: 4–6 buds a foot, 20–30 a vine at 5 ft)', () => {
    const d = buildBlockReport(input()).budLoad!.density;
    expect(d.kept.rangePerVine).toEqual({ min: 20, max: 30 });
    expect(d.how).toBe('33 buds a vine ÷ 5 ft between vines = 6.6 buds a foot of row, against 4–6 a foot: 4 × 5 to 6 × 5 = 20–30 buds a vine');
    expect(d.source).toBe(SOURCES.budDensity);
  });

  it('reports pruning checks as buds left against the crew’s target, not as problems', () => {
    const report = buildBlockReport(input());
    const c = report.pruningChecks!;
    // 24 + 2 × 2 = 28 (on target); 36 + 0 = 36 (29% over).
    expect(c).toMatchObject({ checks: 2, pruners: 2, withTarget: 2, within: 1, over: 1, under: 0, meanTarget: 28 });
    expect(c.meanLeft.how).toBe('On each vine: buds on the canes or spurs kept + renewal spurs × 2 buds. Over the checks: 64 buds ÷ 2 vines = 32 buds a vine');
    expect(c.kept).toEqual({ canes: 2.5, budsOnCanes: 30, renewalSpurs: 1 });
    expect(report.incidence.kinds.map((k) => k.kind)).toEqual(['trunk-injury']);
  });

  it('adjusts the bud target for winter injury in words (Cornell NNY Grape Update, 28 Feb 2014: 35% dead, 40 buds become 54)', () => {
    const a = adjustForBudInjury(40, 35)!;
    expect(a.buds).toBe(54);
    expect(a.how).toBe('35% dead is between 20% and 50%: leave that share more buds, 40 + 35% = 40 × 1.35 = 54 buds (rounded half up)');
    expect(a.source).toBe(SOURCES.budInjury);
    // Purdue ("over 50% bud damage, minimally prune"); Michigan State (delay pruning until after budbreak).
    expect(adjustForBudInjury(40, 60)!.how).toBe('60% dead is over 50%: no bud count; prune minimally, or wait until after budbreak and thin what pushed');
    // Cornell NNY method: dead primaries over buds cut.
    expect(killWorking(20, 7)).toBe('7 of 20 primary buds cut open were dead: 7 ÷ 20 × 100 = 35%');
  });

  it('works out budbreak and shares (budbreak formula from memory, the concept AWRI TR 259; Wilson 1927, Newcombe 1998’s 81 of 263, from memory, recomputed)', () => {
    expect(budbreakWorking(28, 21)).toBe('21 of 28 buds retained pushed a shoot: 21 ÷ 28 × 100 = 75%');
    const w = wilsonInterval(81, 263);
    expect(w.lower).toBeCloseTo(0.2553, 4);
    expect(w.upper).toBeCloseTo(0.3662, 4);
    expect(shareWorking(81, 263, 'vines scouted had it', w)).toBe(
      "81 of 263 vines scouted had it: 81 ÷ 263 = 30.8%; the 95% range around it, by Wilson's score interval, is 25.5% to 36.6%",
    );
  });

  it('works out the crop estimate in words (Dami, Ohio State: vines × clusters × cluster weight; the arithmetic is illustrative, no published example)', () => {
    const v = (value: number) => ({ value, source: 'entered', defaultValue: null, defaultSource: '' });
    // Illustrative: 767 vines on an acre × 40 clusters × 0.25 lb = 3.835 short tons an acre.
    const acre = 4046.8564224;
    const crop = cropEstimate(
      { vines: 767, vinesSource: '', areaM2: acre },
      { budsPerVine: v(0), budbreakPercent: v(0), clustersPerShoot: v(0), clusterWeightG: v((0.25 / (1 / LB)) * 1000 * (1 / LB) * LB), clustersPerVine: v(40) },
    );
    expect(crop.shortTonsPerAcre).toBeCloseTo(3.835, 3);
    expect(crop.how).toMatch(/^767 bearing vines × 40 clusters counted a vine × 113\.4 g a cluster = 3,479 kg\./);
    // University of Maryland Extension (Fiola): "cluster weights will double from lag phase to harvest".
    const lag = cropEstimate(
      { vines: 10, vinesSource: '', areaM2: 0, lagPhaseMultiplier: 2 },
      { budsPerVine: v(20), budbreakPercent: v(90), clustersPerShoot: v(1.5), clusterWeightG: v(100), lagClusterWeightG: v(60) },
    );
    expect(lag.how).toBe(
      '10 bearing vines × 20 buds kept a vine × 90% budbreak × 1.5 clusters a shoot × 120 g a cluster = 32 kg. The harvest cluster weight is 60 g at lag phase × 2 = 120 g.',
    );
  });

  it('sizes next season’s sample in words (Wolpert & Vilas, AJEV 1992: CV 30% at ±10% is 35 vines)', () => {
    const big = buildBlockReport(input({ slots: { planted: 1_000_000, replant: 0, missing: 0, dead: 0, bearingReplants: 0 } }));
    expect(big.crop.sampling.vines).toBe(35);
    expect(big.crop.sampling.how).toMatch(/^\(1\.96 × 30% ÷ 10%\)² = 34\.6 vines; for a block of 1,000,000 bearing vines, .* rounded up: 35 vines$/);
    expect(big.crop.sampling.source).toBe(SOURCES.sampleSize);
  });

  it('names a published source, or says there is none, beside every figure', () => {
    const report = buildBlockReport(input());
    const figures = [
      report.scouting.coverage,
      report.budbreak!.pooled,
      report.budbreak!.weakFigure,
      report.canes!.shadeFigure,
      report.budLoad!.meanKept,
      report.budLoad!.meanTarget!,
      report.pruningChecks!.meanLeft,
      report.ravaz!.index,
      report.harvest!.kgPerVine,
      report.budInjury!.kill,
    ];
    for (const f of figures) {
      expect(f.how, f.label).not.toBe('');
      expect(f.source, f.label).toMatch(/\w{4}/);
    }
    expect(report.budbreak!.weakFigure.source).toMatch(/common practice, no source/);
    expect(report.crop.source).toBe(SOURCES.cropEstimate);
    expect(report.labour.source).toBe(SOURCES.labour);
  });

  it('has no code in any of its words: no calls, settings paths, arrows or camelCase names', () => {
    for (const over of [
      {},
      { options: {} },
      { measured: [], measurements: [], kindRows: [] },
      { options: { clustersPerVine: 30, lagClusterWeightG: 55, budTarget: 40 } },
    ]) {
      const report = buildBlockReport(input(over));
      // `missing` lists the estimate's input codes for the page, which names them in words.
      const leaks = stringsIn(report)
        .filter(({ path }) => !/\.missing\[/.test(path))
        .flatMap(({ path, text }) => codeWords(text).map((w) => `${path}: ${w}`));
      expect(leaks).toEqual([]);
    }
  });
});

describe('the measured spread of vine yields, for the yield sample', () => {
  // 2, 4, 4, 4, 5, 5, 7, 9: sample standard deviation 2.138 over a mean of 5 (the textbook set; from memory) = 42.76%.
  const weighed = [2, 4, 4, 4, 5, 5, 7, 9];

  it("takes last season's single-vine yields first", () => {
    const spread = measuredYieldSpread((s) => (s === 2025 ? weighed : [1, 1, 1, 1, 9]), 2026);
    expect(spread?.season).toBe(2025);
    expect(spread?.vines).toBe(8);
    expect(spread?.cvPercent).toBeCloseTo(42.76, 2);
  });

  it("takes this season's pilot sample when last season weighed fewer than five vines", () => {
    expect(measuredYieldSpread((s) => (s === 2025 ? [3, 4, 5, 6] : weighed), 2026)).toMatchObject({ season: 2026, vines: 8 });
  });

  it('gives none when neither season weighed five vines, so the setting stands', () => {
    expect(measuredYieldSpread((s) => (s === 2025 ? [3, 4] : [5, 6, 7, 8]), 2026)).toBeNull();
    expect(measuredYieldSpread(() => [0, 0, 0, 0, 0], 2026)).toBeNull();
  });
});
