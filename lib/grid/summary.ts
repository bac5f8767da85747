/**
 * The figures beside the grid, from what the grid query returns: counts by kind and severity,
 * incidence per kind with its Wilson interval, the rows with the most problem vines, and slot counts.
 */
import { LEVELS_PER_SLOT, SLOTS, type Slot } from '@/lib/grid/cells';
import { isFindingKind } from '@/lib/labels';
import { wilsonInterval, type ObservationKind, type ProportionInterval } from '@/lib/viticulture';

export interface KindCounts {
  kind: ObservationKind;
  /** Matching observations at severity 0, 1, 2 and 3. */
  bySeverity: [number, number, number, number];
  /** Vines whose worst matching observation of this kind is at least "watch". */
  vinesAffected: number;
}

export interface KindSummary extends KindCounts {
  observations: number;
  /** Share of vines scouted in the period that show this problem; null when none were scouted. */
  incidence: ProportionInterval | null;
}

export interface RowProblems {
  row: number;
  /** Vines at "watch" or worse. */
  problems: number;
  /** Vines at "act now". */
  urgent: number;
}

export interface GridSummary {
  /**
   * Vines with any record in the date range (and by the chosen person), whatever its status, other
   * than a missing-vine record: a hole is found without looking at a vine.
   */
  vinesScouted: number;
  byLevel: { watch: number; act: number; urgent: number };
  /** Findings: what scouts found on the vines, each with its incidence. */
  kinds: KindSummary[];
  /**
   * Records of the work (pruning records, pruning checks) and notes: counted, never an incidence,
   * since their severity says how far a pruner was off the bud target, not that a vine has a problem.
   */
  records: KindSummary[];
  worstRows: RowProblems[];
  slots: Record<Slot, number>;
}

export const WORST_ROWS = 5;
const NO_SLOT = SLOTS.indexOf('none');

export function summariseGrid(rows: readonly number[], cells: readonly (readonly number[])[], kinds: readonly KindCounts[], vinesScouted: number): GridSummary {
  // A 22,500-vine block is read on every grid request: each row's codes are tallied by index into
  // a typed array, and the slots and levels read from the 25 tallies, not from each vine.
  const perSlot = SLOTS.map(() => 0);
  // A cell's level is its severity + 1: 2 is "watch", 3 "act", 4 "act now".
  const perLevel = [0, 0, 0, 0, 0];
  const perRow: RowProblems[] = [];
  const tally = new Int32Array(SLOTS.length * LEVELS_PER_SLOT);
  for (let i = 0; i < cells.length; i++) {
    const codes = cells[i]!;
    tally.fill(0);
    for (let j = 0; j < codes.length; j++) tally[codes[j]!]!++;
    let problems = 0;
    let urgent = 0;
    for (let slot = 0; slot < NO_SLOT; slot++) {
      for (let level = 0; level < LEVELS_PER_SLOT; level++) {
        const n = tally[slot * LEVELS_PER_SLOT + level]!;
        perSlot[slot]! += n;
        perLevel[level]! += n;
        if (level >= 2) problems += n;
        if (level === 4) urgent += n;
      }
    }
    if (problems) perRow.push({ row: rows[i]!, problems, urgent });
  }
  const slots = Object.fromEntries(SLOTS.map((s, i) => [s, perSlot[i]!])) as Record<Slot, number>;
  const byLevel = { watch: perLevel[2]!, act: perLevel[3]!, urgent: perLevel[4]! };
  perRow.sort((a, b) => b.problems - a.problems || b.urgent - a.urgent || a.row - b.row);
  const slotCount = SLOTS.reduce((sum, s) => (s === 'none' ? sum : sum + slots[s]), 0);
  return {
    vinesScouted,
    byLevel,
    kinds: kinds.filter((k) => isFindingKind(k.kind)).map((k) => ({ ...k, observations: total(k), incidence: incidenceOf(k, vinesScouted, slotCount) })),
    records: kinds.filter((k) => !isFindingKind(k.kind)).map((k) => ({ ...k, observations: total(k), incidence: null })),
    worstRows: perRow.slice(0, WORST_ROWS),
    slots,
  };
}

const total = (k: KindCounts) => k.bySeverity.reduce((a, b) => a + b, 0);

/**
 * Incidence as the season report counts it: a kind over the vines scouted; missing or dead vines
 * over every slot, since a hole is known whether or not anyone looked at the vine beside it.
 */
function incidenceOf(k: KindCounts, vinesScouted: number, slotCount: number): ProportionInterval | null {
  const outOf = k.kind === 'missing-vine' ? slotCount : vinesScouted;
  // A vine can only be affected if it was counted, but guard against a count from another filter.
  return outOf > 0 ? wilsonInterval(Math.min(k.vinesAffected, outOf), outOf) : null;
}
