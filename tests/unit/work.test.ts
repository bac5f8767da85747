import { describe, expect, it } from 'vitest';
import {
  buildBlockProgress,
  estimatedPassHours,
  projectFinish,
  projectedPersonHours,
  projectedWorkCost,
  toContract,
  vinesPerPersonHour,
  workCost,
  type ProgressFacts,
} from '@/lib/work';

describe('pace: vines per person-hour', () => {
  it('reads 60 vines an hour from Cornell’s one minute a vine, 13.45 h for 807 vines', () => {
    // Martinson & Vanden Heuvel (Cornell, "Training systems and labor"): 1 min/vine = 13.5 h/acre at 807 vines/acre.
    expect(vinesPerPersonHour(807, 13.45)).toBeCloseTo(60, 6);
  });

  it('reads 75 vines an hour from one Marlborough worker’s 600 vines in an 8-hour day', () => {
    // stuff.co.nz (2014): one worker cuts and wraps about 600 vines a day; the 8-hour day is common practice, no source.
    expect(vinesPerPersonHour(600, 8)).toBe(75);
  });

  it('has no pace before any hours are recorded', () => {
    expect(vinesPerPersonHour(0, 0)).toBeNull();
    expect(vinesPerPersonHour(10, 0)).toBeNull();
  });
});

describe('projection', () => {
  it('projects the whole pass at the pace so far (hand-worked: 1,000 vines in 20 h, 3,000 vines → 20 + 2,000 ÷ 50 = 60 h)', () => {
    expect(projectedPersonHours({ vinesDone: 1000, vineCount: 3000, personHours: 20 })).toBe(60);
  });

  it('has no projected hours without a pace', () => {
    expect(projectedPersonHours({ vinesDone: 0, vineCount: 3000, personHours: 0 })).toBeNull();
    expect(projectedPersonHours({ vinesDone: 0, vineCount: 3000, personHours: 5 })).toBeNull();
  });

  it('projects the finish from vines per day worked (hand-worked: 600 in 3 days, 900 left at 200 a day → 5 more days)', () => {
    expect(projectFinish({ vinesDone: 600, vineCount: 1500, workDays: ['2026-07-01', '2026-07-02', '2026-07-03'] })).toBe('2026-07-08');
  });

  it('counts a day worked by two crews once, in any order', () => {
    expect(projectFinish({ vinesDone: 600, vineCount: 1500, workDays: ['2026-07-03', '2026-07-01', '2026-07-02', '2026-07-01'] })).toBe('2026-07-08');
  });

  it('crosses a month end (hand-worked: 100 a day, 250 left → 3 days after 30 June is 3 July)', () => {
    expect(projectFinish({ vinesDone: 100, vineCount: 350, workDays: ['2026-06-30'] })).toBe('2026-07-03');
  });

  it('ends on the last day worked once every vine is done, and has no date before any work', () => {
    expect(projectFinish({ vinesDone: 1500, vineCount: 1500, workDays: ['2026-07-01', '2026-07-09'] })).toBe('2026-07-09');
    expect(projectFinish({ vinesDone: 0, vineCount: 1500, workDays: [] })).toBeNull();
  });
});

describe('cost for both pay bases', () => {
  const hourly = { basis: 'hourly', hourlyRate: 25, pieceRatePerVine: null } as const;
  const piece = { basis: 'piece-rate', hourlyRate: null, pieceRatePerVine: 1.2 } as const;

  it('pays person-hours by the hour (hand-worked: 60 h × 25 = 1,500)', () => {
    expect(workCost(hourly, { personHours: 60, vines: 3000 })).toBe(1500);
  });

  it('pays vines at a piece rate: a Marlborough worker’s 600 vines at NZ$1.20 a vine is NZ$720', () => {
    // naclachan.co.nz: roughly NZ$1.20 per vine for pruning; stuff.co.nz: about 600 vines a day.
    expect(workCost(piece, { personHours: 8, vines: 600 })).toBeCloseTo(720, 9);
  });

  it('prices a Coonawarra spaced-spur block of 1,000 vines at A$0.70 a vine at A$700 for the whole pass', () => {
    // balnaves.com.au/pruning: the hand part of spaced-spur pruning costs up to A$0.70 per vine.
    expect(projectedWorkCost({ basis: 'piece-rate', hourlyRate: null, pieceRatePerVine: 0.7 }, { vineCount: 1000, projectedHours: null })).toBeCloseTo(700, 9);
  });

  it('projects hourly cost from the projected hours, and knows nothing without a rate or hours', () => {
    expect(projectedWorkCost(hourly, { vineCount: 3000, projectedHours: 60 })).toBe(1500);
    expect(projectedWorkCost(hourly, { vineCount: 3000, projectedHours: null })).toBeNull();
    expect(workCost({ basis: 'hourly', hourlyRate: null, pieceRatePerVine: 2 }, { personHours: 5, vines: 5 })).toBeNull();
    expect(workCost({ basis: 'piece-rate', hourlyRate: 30, pieceRatePerVine: null }, { personHours: 5, vines: 5 })).toBeNull();
  });
});

describe('estimated hours from the pruning-labour estimate', () => {
  it('estimates a spur-pruned acre of 807 vines at 13.45 h, and no other pass', () => {
    // Cornell: 1 minute per vine (the spur default) → 13.5 h/acre at 807 vines/acre.
    expect(estimatedPassHours('pruning', { trainingSystem: 'spur', vineCount: 807 })).toBeCloseTo(13.45, 9);
    expect(estimatedPassHours('tying', { trainingSystem: 'spur', vineCount: 807 })).toBeNull();
  });
});

describe('a block’s progress, hand-worked', () => {
  // Four rows of 10 slots, 38 standing (row 4 has two missing slots).
  const facts: ProgressFacts = {
    block: { id: 'b', name: 'Test', trainingSystem: 'spur', rows: [1, 2, 3, 4], vineCount: 38 },
    rows: [
      { pass: 'pruning', row: 1, vines: 10, whole: true, personHours: 2 },
      { pass: 'pruning', row: 2, vines: 10, whole: true, personHours: 3 },
      { pass: 'pruning', row: 3, vines: 5, whole: false, personHours: 1 },
      { pass: 'tying', row: 1, vines: 10, whole: true, personHours: 1 },
    ],
    leads: [
      { pass: 'pruning', userId: 'a', name: 'A', vines: 20, personHours: 4 },
      { pass: 'pruning', userId: 'b', name: 'B', vines: 5, personHours: 2 },
    ],
    workDays: { pruning: ['2026-07-01', '2026-07-02'], tying: ['2026-07-03'] },
    pay: { basis: 'hourly', hourlyRate: 30, pieceRatePerVine: null },
  };
  const progress = buildBlockProgress(facts);
  const pruning = progress.passes.find((p) => p.pass === 'pruning')!;

  it('adds rows, vines and hours', () => {
    expect(toContract(pruning)).toEqual({
      pass: 'pruning',
      rowCount: 4,
      rowsDone: 2,
      vineCount: 38,
      vinesDone: 25,
      personHours: 6,
      // 25 ÷ 6 = 4.1666…
      vinesPerPersonHour: 4.17,
      // 38 vines × 1 min ÷ 60 = 0.6333… h
      estimatedHours: 0.63,
      // 25 vines in 2 days = 12.5 a day; 13 left → 2 more days after 2 July
      projectedFinish: '2026-07-04',
      costToDate: 180,
      // 6 h + 13 ÷ (25/6) = 9.12 h, × 30 = 273.60
      projectedCost: 273.6,
    });
  });

  it('shows each row done, partly done or not started, and pace per crew lead', () => {
    expect(pruning.rowStates).toEqual(['done', 'done', 'partly', 'none']);
    expect(pruning.leads.map((l) => [l.name, l.vinesPerPersonHour])).toEqual([
      ['A', 5],
      ['B', 2.5],
    ]);
  });

  it('lists rows pruned but not tied', () => {
    expect(progress.prunedNotTied).toEqual([2]);
  });

  it('falls back to the estimate for a pass not started, and prices piece work by the vine', () => {
    const piece = buildBlockProgress({ ...facts, rows: [], leads: [], workDays: {}, pay: { basis: 'piece-rate', hourlyRate: null, pieceRatePerVine: 0.5 } });
    const p = piece.passes.find((x) => x.pass === 'pruning')!;
    expect([p.vinesDone, p.costToDate, p.projectedCost, p.projectedFinish, p.vinesPerPersonHour]).toEqual([0, 0, 19, null, null]);
    const hourly = buildBlockProgress({ ...facts, rows: [], leads: [], workDays: {} }).passes.find((x) => x.pass === 'pruning')!;
    // 0.6333 h × 30 = 19.00
    expect(hourly.projectedCost).toBe(19);
  });
});
