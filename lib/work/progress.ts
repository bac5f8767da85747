/**
 * A block's progress in each pass of a season, from what the progress queries count per row:
 * the contract of GET /api/blocks/{id}/progress, plus the detail the manager's page shows (each
 * row's state, each crew lead's pace, rows pruned but not tied).
 */
import { defaultMinutesPerVine, type TrainingSystem } from '@/lib/reports/estimates';
import { estimatePruningLabour } from '@/lib/viticulture';
import { projectedWorkCost, workCost, type PayBasis } from './cost';
import { projectFinish, projectedPersonHours, vinesPerPersonHour } from './pace';
import { ROW_WORK_PASSES, type RowWorkPass } from './passes';

/** One pass over one row (or one crew lead's share of it), as the progress query counts it. */
export interface RowCoverage {
  pass: RowWorkPass;
  row: number;
  /** Standing vines (planted and replant slots) the runs cover, each once. */
  vines: number;
  /** The runs cover the row end to end. */
  whole: boolean;
  personHours: number;
}

export interface LeadCoverage {
  pass: RowWorkPass;
  userId: string | null;
  name: string | null;
  vines: number;
  personHours: number;
}

export interface ProgressBlock {
  id: string;
  name: string;
  trainingSystem: TrainingSystem;
  rows: number[];
  /** Standing vines: planted and replant slots. */
  vineCount: number;
}

export interface ProgressFacts {
  block: ProgressBlock;
  rows: RowCoverage[];
  leads: LeadCoverage[];
  /** Days worked per pass, `YYYY-MM-DD` in UTC. */
  workDays: Partial<Record<RowWorkPass, string[]>>;
  pay: PayBasis;
}

export interface PassProgress {
  pass: RowWorkPass;
  rowCount: number;
  rowsDone: number;
  vineCount: number;
  vinesDone: number;
  personHours: number;
  vinesPerPersonHour: number | null;
  estimatedHours: number | null;
  projectedFinish: string | null;
  costToDate: number | null;
  projectedCost: number | null;
}

export type RowState = 'done' | 'partly' | 'none';

export interface PassDetail extends PassProgress {
  /** Person-hours for the whole pass at the pace so far, else the estimate. */
  projectedHours: number | null;
  /** The state of each row in `block.rows` order. */
  rowStates: RowState[];
  leads: { userId: string | null; name: string | null; vines: number; personHours: number; vinesPerPersonHour: number | null }[];
  workDays: number;
  lastWorked: string | null;
}

export interface BlockProgress {
  block: ProgressBlock;
  passes: PassDetail[];
  /** Rows pruned end to end but not yet tied end to end. */
  prunedNotTied: number[];
}

const round = (v: number | null, places = 2) => (v === null ? null : Math.round(v * 10 ** places) / 10 ** places);

/** Hours the season report's labour section estimates for pruning; the other passes have no estimate. */
export function estimatedPassHours(pass: RowWorkPass, block: Pick<ProgressBlock, 'trainingSystem' | 'vineCount'>): number | null {
  if (pass !== 'pruning') return null;
  return estimatePruningLabour({ vines: block.vineCount, minutesPerVine: defaultMinutesPerVine(block.trainingSystem), hourlyCost: 0 }).hours;
}

export function buildBlockProgress(facts: ProgressFacts): BlockProgress {
  const { block, pay } = facts;
  const passes = ROW_WORK_PASSES.map((pass): PassDetail => {
    const rows = facts.rows.filter((r) => r.pass === pass);
    const byRow = new Map(rows.map((r) => [r.row, r]));
    const vinesDone = rows.reduce((s, r) => s + r.vines, 0);
    const personHours = rows.reduce((s, r) => s + r.personHours, 0);
    const days = facts.workDays[pass] ?? [];
    const estimatedHours = estimatedPassHours(pass, block);
    const projectedHours = projectedPersonHours({ vinesDone, vineCount: block.vineCount, personHours }) ?? estimatedHours;
    return {
      pass,
      rowCount: block.rows.length,
      rowsDone: rows.filter((r) => r.whole).length,
      vineCount: block.vineCount,
      vinesDone,
      personHours: round(personHours)!,
      vinesPerPersonHour: round(vinesPerPersonHour(vinesDone, personHours)),
      estimatedHours: round(estimatedHours),
      projectedFinish: projectFinish({ vinesDone, vineCount: block.vineCount, workDays: days }),
      costToDate: round(workCost(pay, { personHours, vines: vinesDone })),
      projectedCost: round(projectedWorkCost(pay, { vineCount: block.vineCount, projectedHours })),
      projectedHours: round(projectedHours),
      rowStates: block.rows.map((n) => {
        const r = byRow.get(n);
        return r?.whole ? 'done' : r ? 'partly' : 'none';
      }),
      leads: facts.leads
        .filter((l) => l.pass === pass)
        .map((l) => ({ ...l, personHours: round(l.personHours)!, vinesPerPersonHour: round(vinesPerPersonHour(l.vines, l.personHours)) }))
        .sort((a, b) => (b.vinesPerPersonHour ?? 0) - (a.vinesPerPersonHour ?? 0)),
      workDays: new Set(days).size,
      lastWorked: [...days].sort().at(-1) ?? null,
    };
  });
  const whole = (pass: RowWorkPass) => new Set(facts.rows.filter((r) => r.pass === pass && r.whole).map((r) => r.row));
  const tied = whole('tying');
  const prunedNotTied = [...whole('pruning')].filter((r) => !tied.has(r)).sort((a, b) => a - b);
  return { block, passes, prunedNotTied };
}

/** The contract's shape: only the fields DESIGN.md names. */
export function toContract(p: PassDetail): PassProgress {
  const { rowStates: _r, leads: _l, workDays: _w, lastWorked: _d, projectedHours: _h, ...contract } = p;
  return contract;
}
