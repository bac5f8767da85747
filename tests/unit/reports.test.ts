import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { buildBlockReport, type BlockReportInput, type MeasuredObservation } from '@/lib/reports/block-report';
import { compareReports } from '@/lib/reports/compare';
import { CSV_COLUMNS, csvCell, csvHeader, csvLine } from '@/lib/reports/csv';
import { buildEstateReport } from '@/lib/reports/estate-report';
import { cropEstimate, labourEstimate } from '@/lib/reports/estimates';
import { defaultSeason, seasonBounds, seasonLabel, seasonOf, seasonShiftMonths } from '@/lib/reports/season';
import { optionsToSearch, parseReportOptions, readReportOptions } from '@/lib/validation/report';

const LB = 0.45359237;

/** Wilson's score interval written out from the 1927 formula, for the tests to compare against. */
function wilson(k: number, n: number) {
  const z = 1.959963984540054;
  const p = k / n;
  const d = 1 + (z * z) / n;
  const centre = (p + (z * z) / (2 * n)) / d;
  const half = (z * Math.sqrt((p * (1 - p)) / n + (z * z) / (4 * n * n))) / d;
  return { estimate: p, lower: k === 0 ? 0 : centre - half, upper: k === n ? 1 : centre + half };
}

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
      clone: 'C-1',
      rootstock: 'R-1',
      plantingYear: 2010,
      trainingSystem: 'cane',
      rowSpacingM: 2.5,
      vineSpacingM: 1.2,
      rowCount: 2,
      vinesPerRow: 5,
      vinesPerPanel: null,
    },
    season: 2024,
    units: 'metric',
    slots: { planted: 8, replant: 1, missing: 1, dead: 0, bearingReplants: 0 },
    kindRows: [
      { row: 1, kind: 'weak-budbreak', recorded: 3, affected: 2, observations: 4 },
      { row: 2, kind: 'weak-budbreak', recorded: 1, affected: 0, observations: 1 },
      { row: 2, kind: 'trunk-injury', recorded: 1, affected: 1, observations: 1 },
      { row: 2, kind: 'note', recorded: 1, affected: 0, observations: 1 },
      { row: 2, kind: 'missing-vine', recorded: 1, affected: 1, observations: 1 },
      // Records of the work, off target on one vine each: never a problem's incidence.
      { row: 1, kind: 'pruning-record', recorded: 2, affected: 1, observations: 2 },
      { row: 2, kind: 'pruning-check', recorded: 1, affected: 1, observations: 1 },
    ],
    scoutedRows: [
      { row: 1, vines: 3, slots: 5 },
      { row: 2, vines: 2, slots: 5 },
    ],
    observations: 7,
    measured: [
      obs(1, 1, 'weak-budbreak', { budsRetained: 20, budsPushed: 4 }, '2024-04-10'),
      obs(1, 1, 'weak-budbreak', { budsRetained: 20, budsPushed: 19 }),
      obs(1, 2, 'weak-budbreak', { budsRetained: 20, budsPushed: 10 }),
      obs(1, 3, 'weak-budbreak', { budsRetained: 30, budsPushed: 21 }),
      obs(2, 1, 'weak-budbreak', { budsRetained: 30, budsPushed: 30 }),
      obs(1, 1, 'pruning-record', { canesKept: 2, budsPerCane: 12, renewalSpurs: 2, pruningWeightKg: 1 }, '2024-01-20'),
      obs(1, 2, 'pruning-record', { canesKept: 2, budsPerCane: 10, renewalSpurs: 1 }, '2024-01-20'),
      obs(2, 1, 'pruning-record', { canesKept: 3, budsPerCane: 10, renewalSpurs: 0 }, '2024-01-20'),
      obs(1, 1, 'cane-diameter', { diameterMm: 9.5, exposure: 'sun', colourGood: true }, '2024-01-20'),
      obs(1, 2, 'cane-diameter', { diameterMm: 8, longestInternodeMm: 200 }, '2024-01-20'),
      obs(2, 2, 'shade-cane', { longestInternodeMm: 150, exposure: 'shade', colourGood: false, diameterMm: 7 }, '2024-11-20'),
      obs(1, 4, 'bud-injury', { budsCut: 20, primariesDead: 5 }, '2024-01-05'),
      obs(2, 4, 'bud-injury', { budsCut: 30, primariesDead: 10 }, '2024-01-05'),
    ],
    measurements: [
      { kind: 'pruning-weight', season: 2024, row: 1, position: 2, vines: 1, weightKg: 0.5, clusters: null },
      { kind: 'pruning-weight', season: 2024, row: 2, position: null, vines: 4, weightKg: 3.2, clusters: null },
      { kind: 'yield', season: 2024, row: 1, position: 1, vines: 1, weightKg: 6, clusters: 50 },
      { kind: 'yield', season: 2024, row: 2, position: null, vines: 4, weightKg: 16, clusters: null },
      { kind: 'pruning-weight', season: 2025, row: 1, position: 1, vines: 1, weightKg: 0.75, clusters: null },
      { kind: 'pruning-weight', season: 2025, row: 2, position: null, vines: 4, weightKg: 4, clusters: null },
      { kind: 'yield', season: 2023, row: 1, position: 3, vines: 1, weightKg: 2.4, clusters: 20 },
    ],
    recordedWeights: [],
    replant: [
      { row: 2, position: 5, clone: null, rootstock: null, reason: 'missing' },
      { row: 1, position: 5, clone: 'C-2', rootstock: 'R-1', reason: 'recorded-dead' },
    ],
    tasks: null,
    options: {},
    ...over,
  };
}

describe('block report assembly', () => {
  const report = buildBlockReport(input());

  it('counts incidence over the vines scouted, block and row, with Wilson intervals, leaving notes, pruning records and pruning checks out', () => {
    expect(report.scouting.vinesScouted).toBe(5);
    expect(report.incidence.kinds.map((k) => k.kind)).toEqual(['weak-budbreak', 'trunk-injury', 'missing-vine']);
    const budbreak = report.incidence.kinds[0]!;
    expect(budbreak.vinesAffected).toBe(2);
    expect(budbreak.incidence.lower).toBeCloseTo(wilson(2, 5).lower, 12);
    expect(budbreak.incidence.upper).toBeCloseTo(wilson(2, 5).upper, 12);
    expect(budbreak.how).toMatch(/^2 of 5 vines scouted had it at "watch" or worse: 2 ÷ 5 = 40%; the 95% range around it, by Wilson's score interval, is /);
    expect(report.incidence.source).toMatch(/Wilson \(1927\)/);
    const row1 = report.incidence.rows.find((r) => r.row === 1)!;
    expect(row1.kinds['weak-budbreak']!.incidence.upper).toBeCloseTo(wilson(2, 3).upper, 12);
    expect(report.incidence.rows.find((r) => r.row === 2)!.kinds.note).toBeUndefined();
    expect(report.incidence.rows.find((r) => r.row === 1)!.kinds['pruning-record']).toBeUndefined();
    expect(report.incidence.rows.find((r) => r.row === 2)!.kinds['pruning-check']).toBeUndefined();
  });

  it('counts missing and dead vines against the slots, which are known whether or not a vine was looked at', () => {
    const missing = report.incidence.kinds.find((k) => k.kind === 'missing-vine')!;
    expect(missing).toMatchObject({ base: 'slots', outOf: 10, vinesAffected: 1 });
    expect(missing.how).toMatch(/^1 of 10 slots in the block had it/);
    expect(missing.incidence.upper).toBeCloseTo(wilson(1, 10).upper, 12);
    expect(report.incidence.rows.find((r) => r.row === 2)!.kinds['missing-vine']).toMatchObject({ affected: 1, outOf: 5 });
  });

  it('reads budbreak from each vine’s latest check: pooled share, weak vines and a ten-band histogram', () => {
    const b = report.budbreak!;
    // Vine 1/1's early check (4 of 20) is superseded by its later one (19 of 20).
    expect(b.vinesChecked).toBe(4);
    expect(b.budsRetained).toBe(100);
    expect(b.budsPushed).toBe(80);
    expect(b.pooled.value).toBe(80);
    // 95%, 50%, 70%, 100%: two under the 75% line.
    expect(b.weakVines).toBe(2);
    expect(b.weakShare.upper).toBeCloseTo(wilson(2, 4).upper, 12);
    expect(b.histogram.map((h) => h.count)).toEqual([0, 0, 0, 0, 0, 1, 0, 1, 0, 2]);
  });

  it('sets each pruning record against the balanced-pruning target of the weight on the record, the vine’s entry or the row sample', () => {
    const l = report.budLoad!;
    const byVine = Object.fromEntries(l.vines.map((v) => [`${v.row}:${v.position}`, v]));
    // 2 × 12 + 2 renewal spurs of 2 buds = 28; 1 kg of prunings under 20 + 20 per lb.
    expect(byVine['1:1']).toMatchObject({ kept: 28, weightSource: 'record', target: Math.floor(20 + 20 * (1 / LB - 1)) });
    // 0.5 kg is under a pound: the first-pound allowance scaled down.
    expect(byVine['1:2']).toMatchObject({ kept: 22, weightSource: 'vine', target: Math.floor(20 * (0.5 / LB)) });
    expect(byVine['2:1']).toMatchObject({ kept: 30, weightSource: 'row-sample', target: Math.floor(20 + 20 * (0.8 / LB - 1)) });
    expect(l.meanKept.value).toBeCloseTo(80 / 3, 12);
    expect(byVine['1:1']!.deviationPercent).toBeCloseTo(((28 - 44) / 44) * 100, 12);
  });

  it('pairs a harvest with the next winter’s prunings for the Ravaz index, vine with vine and row sample with row sample', () => {
    const r = report.ravaz!;
    expect(r.vintage).toBe(2024);
    expect(r.units.map((u) => [u.row, u.position, u.index])).toEqual([
      [1, 1, 8],
      [2, null, 4],
    ]);
    // Vine-weighted means: yields (6 + 4 × 4) / 5, prunings (0.75 + 4 × 1) / 5.
    expect(r.index.value).toBeCloseTo(4.4 / 0.95, 12);
    expect(r.readings).toEqual({ 'under-cropped': 1, balanced: 1, 'over-cropped': 0 });
  });

  it('falls back to the season before for Ravaz when next winter’s prunings are not weighed yet', () => {
    const later = buildBlockReport(input({ season: 2025, measurements: input().measurements.filter((m) => m.season !== 2025 || m.kind === 'yield') }));
    expect(later.ravaz).toBeNull();
    expect(later.ravazNote).toMatch(/No vine or row sample has both/);
  });

  it('sums bud-injury samples and raises the bud target by the kill, from the mean balanced target', () => {
    const i = report.budInjury!;
    expect(i.kill.value).toBeCloseTo(30, 12);
    const targets = report.budLoad!.vines.map((v) => v.target!);
    const target = Math.round(targets.reduce((a, b) => a + b, 0) / targets.length);
    expect(i.target.value).toBe(target);
    expect(i.adjusted!.buds).toBe(Math.floor((target * 130) / 100 + 0.5));
    expect(i.adjusted!.advice).toBe('leave-extra');
    expect(i.byRow.map((r) => r.killPercent)).toEqual([25, (10 / 30) * 100]);
  });

  it('counts canes one per record, with shade canes from shade-cane records and long internodes', () => {
    const c = report.canes!;
    expect(c.canes).toBe(3);
    expect(c.shadeCanes).toBe(2);
    expect(c.meanDiameterMm).toBeCloseTo((9.5 + 8 + 7) / 3, 12);
    expect(c.verdicts).toEqual({ 'fruit-cane': 1, 'if-nothing-better': 1, remove: 0 });
  });

  it('estimates the crop from bearing vines, mean buds kept, budbreak and the last harvest’s cluster weight', () => {
    expect(report.crop.basis.vines).toBe(8);
    expect(report.crop.inputs.budsPerVine.value).toBe(26.7);
    expect(report.crop.inputs.budbreakPercent.value).toBe(80);
    expect(report.crop.inputs.clusterWeightG).toMatchObject({
      value: 120,
      source: expect.stringMatching(/^mean cluster weight of the 2023 harvest samples \(\d+ vines, \d+ clusters\)$/),
    });
    expect(report.crop.estimate.kg).toBeCloseTo((8 * 26.7 * 0.8 * 1.5 * 120) / 1000, 9);
    expect(report.crop.estimate.tonnesPerHa).toBeCloseTo(report.crop.estimate.kg! / 1000 / ((10 * 2.5 * 1.2) / 10000), 9);
  });

  it('reads Ravaz against the grape type: Concord vines at 15 are balanced, not over-cropped (Bates, Cornell LERGP, "Vine Size: Magic Number 15")', () => {
    // A Concord-like vine and row: 15 kg on 1 kg of prunings, 60 kg on 4 kg over four vines.
    const measurements = [
      { kind: 'yield' as const, season: 2024, row: 1, position: 1, vines: 1, weightKg: 15, clusters: null },
      { kind: 'pruning-weight' as const, season: 2025, row: 1, position: 1, vines: 1, weightKg: 1, clusters: null },
    ];
    const vinifera = buildBlockReport(input({ measurements }));
    expect(vinifera.ravaz).toMatchObject({ reading: 'over-cropped', range: { underBelow: 5, overAbove: 10 } });
    const concord = buildBlockReport(input({ measurements, options: { grapeType: 'concord' } }));
    expect(concord.ravaz).toMatchObject({ reading: 'balanced', range: { underBelow: 10, overAbove: 20 } });
    expect(concord.ravaz!.rangeSource).toMatch(/Magic Number 15/);
    expect(concord.ravaz!.units[0]!.reading).toBe('balanced');
  });

  it('warns when the bud target crowds the row: 20 + 20 at 4 lb is 80 buds, 16 a foot at 5 ft spacing (Ohio State primer: 4–6)', () => {
    const block = { ...input().block, vineSpacingM: 5 * 0.3048 };
    const heavy = buildBlockReport(
      input({
        block,
        kindRows: [],
        measured: [obs(1, 1, 'pruning-record', { canesKept: 2, budsPerCane: 12, renewalSpurs: 2, pruningWeightKg: 4 * LB })],
        measurements: [],
      }),
    );
    const d = heavy.budLoad!.density;
    expect(heavy.budLoad!.meanTarget!.value).toBe(80);
    expect(d.target!.budsPerFt).toBeCloseTo(16, 9);
    expect(d.target!.reading).toBe('over');
    expect(d.kept.rangePerVine).toEqual({ min: 20, max: 30 });
    expect(d.warning).toMatch(/16 buds per foot of row, above the 4–6 a foot \(20–30 a vine/);
    // 28 buds kept on the same spacing: 5.6 a foot, inside the range.
    expect(d.kept.reading).toBe('within');
    // 1 lb of prunings under 20 + 20 is 20 buds: 4 a foot, the low end, no warning.
    const light = buildBlockReport(
      input({
        block,
        kindRows: [],
        measured: [obs(1, 1, 'pruning-record', { canesKept: 2, budsPerCane: 8, renewalSpurs: 2, pruningWeightKg: LB })],
        measurements: [],
      }),
    );
    expect(light.budLoad!.meanTarget!.value).toBe(20);
    expect(light.budLoad!.density.target!.reading).toBe('within');
    expect(light.budLoad!.density.warning).toBeNull();
  });

  it('takes the crop estimate’s budbreak from every budbreak count, and not from weak vines alone', () => {
    // The fixture's counts include vines that pushed well: the pooled 80% stands, with its vine count.
    expect(report.crop.inputs.budbreakPercent.source).toMatch(/^80 of 100 buds pushed over every budbreak count of 2024: 4 vines, 2 of them weak$/);
    const weakOnly = buildBlockReport(
      input({ measured: [obs(1, 1, 'weak-budbreak', { budsRetained: 20, budsPushed: 8 }), obs(1, 2, 'weak-budbreak', { budsRetained: 20, budsPushed: 10 })] }),
    );
    // 40% and 50%, both under 75%: a sample of weak vines only is not the block's budbreak.
    expect(weakOnly.crop.inputs.budbreakPercent.value).toBeNull();
    expect(weakOnly.crop.inputs.budbreakPercent.source).toMatch(/all 2 vines counted pushed under 75%/);
    expect(weakOnly.budbreak!.pooled.value).toBe(45);
  });

  it('says what the crop estimate rests on, and sizes next season’s sample from the CV of vine yields (Wolpert & Vilas 1992)', () => {
    expect(report.crop.restsOn).toMatch(/buds kept per vine 26\.7: mean buds kept on 3 pruning records/);
    expect(report.crop.restsOn).toMatch(/4 vines/);
    // Under five single-vine yields in 2023 and 2024: the default CV of 30% at ±10% → (1.96 × 30 / 10)² = 34.6,
    // corrected for the 8 bearing vines: 34.57 / (1 + 33.57 / 8) = 6.65 → 7.
    expect(report.crop.sampling).toMatchObject({ cvPercent: 30, marginPercent: 10, vines: 7 });
    const yields = [4, 5, 6, 5, 5].map((kg, i) => ({ kind: 'yield' as const, season: 2023, row: 1, position: i + 1, vines: 1, weightKg: kg, clusters: null }));
    const own = buildBlockReport(input({ slots: { planted: 1000, replant: 0, missing: 0, dead: 0, bearingReplants: 0 }, measurements: yields }));
    // 4, 5, 6, 5, 5 kg: sd 0.7071 over mean 5 = 14.14%; (1.96 × 14.14 / 10)² = 7.68, FPC over 1000 → 7.63 → 8.
    expect(own.crop.sampling.cvPercent).toBeCloseTo(14.142, 3);
    expect(own.crop.sampling.vines).toBe(8);
  });

  it('gives the crop the vines can ripen from the Ravaz range × pruning weight, with Concord’s 15 as a single target', () => {
    const concord = buildBlockReport(input({ options: { grapeType: 'concord' } }));
    const t = concord.crop.target!;
    // 2024 prunings: vine 1/2 at 0.5 kg and row 2's 3.2 kg over 4 vines → 3.7 / 5 = 0.74 kg a vine.
    expect(t.pruningKgPerVine).toBeCloseTo(0.74, 12);
    expect(t.lowKgPerVine).toBeCloseTo(7.4, 12);
    expect(t.highKgPerVine).toBeCloseTo(14.8, 12);
    expect(t.targetKgPerVine).toBeCloseTo(11.1, 12);
    expect(report.crop.target!.targetKgPerVine).toBeNull();
    expect(report.crop.target!.highKgPerVine).toBeCloseTo(7.4, 12);
  });

  it('takes clusters counted per vine and a lag-phase cluster weight × 2 (University of Maryland Extension)', () => {
    const counted = buildBlockReport(input({ options: { clustersPerVine: 30, lagClusterWeightG: 60 } }));
    expect(counted.crop.estimate.kg).toBeCloseTo((8 * 30 * 120) / 1000, 9);
    expect(counted.crop.estimate.how).toMatch(
      /^8 bearing vines × 30 clusters counted a vine × 120 g a cluster = 29 kg\. The harvest cluster weight is 60 g at lag phase × 2 = 120 g\./,
    );
    const missing = buildBlockReport(input({ measured: [], options: { clustersPerVine: 30 } }));
    expect(missing.crop.estimate.missing).toEqual([]);
  });

  it('advises minimal pruning, with no bud count, past half the primary buds dead (Purdue; MSU)', () => {
    const dead = buildBlockReport(input({ measured: [...input().measured, obs(1, 3, 'bud-injury', { budsCut: 100, primariesDead: 90 }, '2024-01-06')] }));
    expect(dead.budInjury!.kill.value).toBeGreaterThan(50);
    expect(dead.budInjury!.adjusted).toMatchObject({ buds: null, advice: 'minimal-pruning' });
    expect(dead.budInjury!.limits).toEqual({ extraFromPercent: 20, minimalAbovePercent: 50 });
  });

  it('uses entered inputs over the defaults and says so', () => {
    const entered = buildBlockReport(input({ options: { clustersPerShoot: 2, clusterWeightG: 90, minutesPerVine: 3, hourlyCost: 40, budTarget: 50 } }));
    expect(entered.crop.inputs.clustersPerShoot).toMatchObject({ value: 2, source: 'entered', defaultValue: 1.5 });
    expect(entered.crop.estimate.kg).toBeCloseTo((8 * 26.7 * 0.8 * 2 * 90) / 1000, 9);
    expect(entered.labour.estimate.hours).toBeCloseTo((9 * 3) / 60, 12);
    expect(entered.labour.estimate.cost).toBeCloseTo(((9 * 3) / 60) * 40, 12);
    expect(entered.budInjury!.adjusted!.buds).toBe(65);
  });

  it('costs cane pruning as the slower kind and shows what spur pruning would take', () => {
    const l = report.labour.estimate;
    expect(report.labour.inputs.minutesPerVine.value).toBe(1.75);
    expect(l.hours).toBeCloseTo((9 * 1.75) / 60, 12);
    expect(l.alternative).toMatchObject({ trainingSystem: 'spur', minutesPerVine: 1 });
    const spur = buildBlockReport(input({ block: { ...input().block, trainingSystem: 'spur' } }));
    expect(spur.labour.inputs.minutesPerVine.value).toBe(1);
  });

  it('groups vines to replant by clone and rootstock, taking the block’s for a slot without its own', () => {
    expect(report.replant.byStock).toEqual([
      { clone: 'C-1', rootstock: 'R-1', vines: 1 },
      { clone: 'C-2', rootstock: 'R-1', vines: 1 },
    ]);
    expect(report.replant.byRow).toEqual([
      { row: 1, positions: [5] },
      { row: 2, positions: [5] },
    ]);
  });

  it('says when tasks are not available rather than reporting none', () => {
    expect(report.tasks).toEqual({ available: false, open: 0, done: 0, cancelled: 0, list: [] });
  });

  it('leaves sections out when nothing was recorded for them, defaults the buds kept from Ohio State’s 4–6 a foot, and asks for the budbreak', () => {
    const empty = buildBlockReport(input({ kindRows: [], scoutedRows: [{ row: 1, vines: 0, slots: 5 }], measured: [], measurements: [], observations: 0 }));
    expect(empty.budbreak).toBeNull();
    expect(empty.canes).toBeNull();
    expect(empty.budLoad).toBeNull();
    expect(empty.budInjury).toBeNull();
    expect(empty.incidence.kinds).toEqual([]);
    expect(empty.crop.estimate).toMatchObject({ kg: null, missing: ['budbreakPercent'] });
    expect(empty.crop.estimate.how).toBe('The estimate needs the budbreak.');
    // 5 buds a foot (the middle of Ohio State 2023 primer's 4–6) × 1.2 m = 3.94 ft → 19.7 buds, marked a default.
    expect(empty.crop.inputs.budsPerVine).toMatchObject({
      value: 19.7,
      source: expect.stringMatching(/^default, as no pruning records were made this season: 5 buds a foot of row \(the middle of Ohio State's 4–6\)/),
    });
  });
});

describe('estimates', () => {
  it('recompute the crop and labour from the inputs alone, as the page does while someone types', () => {
    const basis = { vines: 1000, vinesSource: '', areaM2: 3000 };
    const v = (value: number | null) => ({ value, source: 'entered', defaultValue: null, defaultSource: '' });
    const crop = cropEstimate(basis, { budsPerVine: v(30), budbreakPercent: v(90), clustersPerShoot: v(1.5), clusterWeightG: v(100) });
    expect(crop.kg).toBeCloseTo(4050, 9);
    expect(crop.how).toBe(
      '1,000 bearing vines × 30 buds kept a vine × 90% budbreak × 1.5 clusters a shoot × 100 g a cluster = 4,050 kg. Over 0.3 ha of planted slots that is 13.5 t/ha.',
    );
    expect(crop.shortTonsPerAcre).toBeCloseTo(4050 / 907.18474 / (0.3 / 0.40468564224), 9);
    expect(cropEstimate(basis, { budsPerVine: v(null), budbreakPercent: v(90), clustersPerShoot: v(1.5), clusterWeightG: v(100) }).missing).toEqual([
      'budsPerVine',
    ]);
    const labour = labourEstimate({ vines: 807, trainingSystem: 'spur', areaM2: 4046.8564224 }, { minutesPerVine: v(1), hourlyCost: v(20) });
    // One minute a vine on an acre of 807 vines: 13.45 hours (Cornell's "13.5").
    expect(labour.hoursPerAcre).toBeCloseTo(13.45, 9);
    expect(labour.cost).toBeCloseTo(269, 9);
  });
});

describe('year over year', () => {
  it('sets both seasons’ figures side by side and lists persisting problems by kind', () => {
    const now = buildBlockReport(input());
    const before = buildBlockReport(
      input({
        season: 2023,
        kindRows: [{ row: 1, kind: 'trunk-injury', recorded: 2, affected: 1, observations: 2 }],
        scoutedRows: [{ row: 1, vines: 4, slots: 5 }],
        measured: [],
      }),
    );
    const c = compareReports(now, before, {
      total: 1,
      byKind: [{ kind: 'trunk-injury', vines: 1 }],
      vines: [{ row: 2, position: 3, kind: 'trunk-injury', before: 1, now: 3 }],
    });
    expect(c.rows.find((r) => r.label === 'Vines scouted')).toMatchObject({ before: 4, now: 5 });
    expect(c.rows.find((r) => r.label === 'Share of weak vines')).toMatchObject({ before: null, beforeText: '–', now: 0.5, nowText: '50%' });
    expect(c.kinds.find((k) => k.kind === 'trunk-injury')).toMatchObject({ before: 0.25, now: 0.2 });
    expect(c.persisted.byKind).toEqual([{ kind: 'trunk-injury', label: 'Trunk injury', vines: 1 }]);
  });

  it('adds blocks into an estate incidence over all vines scouted', () => {
    const a = buildBlockReport(input());
    const b = buildBlockReport(
      input({
        block: { ...input().block, id: 'b2' },
        kindRows: [{ row: 1, kind: 'trunk-injury', recorded: 1, affected: 1, observations: 1 }],
        scoutedRows: [{ row: 1, vines: 10, slots: 10 }],
      }),
    );
    const estate = buildEstateReport(2024, [a, b]);
    const trunk = estate.kinds.find((k) => k.kind === 'trunk-injury')!;
    expect(trunk.vinesAffected).toBe(2);
    expect(trunk.incidence.upper).toBeCloseTo(wilson(2, 15).upper, 12);
    expect(trunk.byBlock.b2!.estimate).toBeCloseTo(0.1, 12);
    expect(estate.totals.replant).toBe(4);
    expect(estate.replantByStock).toEqual([
      { clone: 'C-1', rootstock: 'R-1', vines: 2 },
      { clone: 'C-2', rootstock: 'R-1', vines: 2 },
    ]);
  });
});

describe('observation CSV', () => {
  const row = {
    id: '7f1c2d3e-0000-4000-8000-000000000001',
    blockId: 'b1',
    blockName: 'Creek, "low" end',
    row: 3,
    position: 7,
    kind: 'weak-budbreak',
    severity: 2,
    status: 'open',
    observedAt: new Date('2024-04-20T09:30:00.123Z'),
    closedAt: null,
    recordedBy: 'Ana',
    note: 'cold pocket,\nsee "row 4"',
    data: { budsRetained: 28, budsPushed: 11 },
  };

  it('has a fixed header of documented columns', () => {
    expect(csvHeader()).toBe(`${CSV_COLUMNS.join(',')}\r\n`);
    expect(CSV_COLUMNS[0]).toBe('observation_id');
    expect(CSV_COLUMNS.at(-1)).toBe('data_json');
  });

  it('quotes commas, quotes and line breaks, doubles quotes, and round-trips through a CSV parser', () => {
    const line = csvLine(row);
    expect(line).toContain('"Creek, ""low"" end"');
    expect(line).toContain('"cold pocket,\nsee ""row 4"""');
    const parsed = Papa.parse<string[]>(csvHeader() + line, { skipEmptyLines: true }).data;
    expect(parsed[1]).toHaveLength(CSV_COLUMNS.length);
    const cell = (name: string) => parsed[1]![CSV_COLUMNS.indexOf(name as never)];
    expect(cell('note')).toBe(row.note);
    expect(cell('block_name')).toBe(row.blockName);
    expect(cell('season')).toBe('2024');
    expect(cell('observed_at')).toBe('2024-04-20T09:30:00.123Z');
    expect(cell('budbreak_percent')).toBe('39.29');
    expect(JSON.parse(cell('data_json')!)).toEqual(row.data);
  });

  it('keeps a spreadsheet from running a note as a formula', () => {
    expect(csvCell('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
    expect(csvCell('-3 buds')).toBe("'-3 buds");
    expect(csvCell(-3)).toBe('-3');
  });

  it('exports the raw fields of a stored record the calculations refuse', () => {
    const odd = csvLine({ ...row, note: '', data: { budsRetained: 10, budsPushed: 12 } });
    const cells = Papa.parse<string[]>(odd).data[0]!;
    expect(cells[CSV_COLUMNS.indexOf('buds_pushed')]).toBe('12');
    expect(cells[CSV_COLUMNS.indexOf('budbreak_percent')]).toBe('');
  });
});

describe('report options and seasons', () => {
  it('read the URL strictly for the API and leniently for the page', () => {
    expect(parseReportOptions(new URLSearchParams('season=2024&clustersPerShoot=1.8'))).toEqual({ season: 2024, clustersPerShoot: 1.8 });
    expect(() => parseReportOptions(new URLSearchParams('clusterWeightG=-5'))).toThrow();
    expect(() => parseReportOptions(new URLSearchParams('colour=red'))).toThrow();
    expect(readReportOptions(new URLSearchParams('season=2024&clusterWeightG=heavy&colour=red'))).toEqual({ season: 2024 });
    expect(optionsToSearch({ season: 2024, compare: 'none' }).toString()).toBe('season=2024&compare=none');
  });

  it('are calendar years in UTC, defaulting to the latest with records', () => {
    expect(seasonBounds(2024)).toEqual({ from: '2024-01-01T00:00:00.000Z', to: '2025-01-01T00:00:00.000Z' });
    expect(defaultSeason([2023, 2025], new Date('2026-03-01'))).toBe(2025);
    expect(defaultSeason([], new Date('2026-03-01'))).toBe(2026);
  });

  // Southern-hemisphere estates prune from about May to September (workflows reference: stuff.co.nz)
  // and harvest early in the calendar year; naming a season by its harvest year is common practice,
  // no source.
  it('may start in another month, spanning two years and named by the year they end in', () => {
    expect(seasonBounds(2026, 7)).toEqual({ from: '2025-07-01T00:00:00.000Z', to: '2026-07-01T00:00:00.000Z' });
    expect(seasonOf('2025-06-30T23:59:59Z', 7)).toBe(2025);
    expect(seasonOf('2025-07-01T00:00:00Z', 7)).toBe(2026);
    expect(seasonOf('2026-03-15T08:00:00Z', 7)).toBe(2026);
    expect(seasonOf('2026-03-15T08:00:00Z')).toBe(2026);
    expect(seasonLabel(2026, 7)).toBe('2025–26');
    expect(seasonLabel(2000, 9)).toBe('1999–00');
    expect(seasonLabel(2026)).toBe('2026');
    expect(defaultSeason([], new Date('2026-08-01'), 7)).toBe(2027);
    expect(() => seasonBounds(2026, 13)).toThrow(RangeError);
    expect(() => seasonOf('2026-01-01', 0)).toThrow(RangeError);
  });

  it('place every moment in exactly one season, whatever the start month', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 12 }), fc.date({ min: new Date('1990-01-01'), max: new Date('2100-01-01'), noInvalidDate: true }), (month, at) => {
        const season = seasonOf(at, month);
        const { from, to } = seasonBounds(season, month);
        expect(at.getTime()).toBeGreaterThanOrEqual(Date.parse(from));
        expect(at.getTime()).toBeLessThan(Date.parse(to));
        // The shift SQL uses names the same season.
        const shifted = new Date(at);
        shifted.setUTCMonth(shifted.getUTCMonth() + seasonShiftMonths(month), 1);
        expect(shifted.getUTCFullYear()).toBe(season);
      }),
    );
  });
});
