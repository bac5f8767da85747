/**
 * Incidence by problem. Only findings count: pruning records and pruning checks say how far a pruner
 * was off the bud target, not that a vine has a problem, and notes are remarks (see RECORD_KINDS).
 * A vine "has" a kind when its worst record of that kind in the season is at least "watch" (1);
 * closed records count, since the report is the season's history. Incidence is over the vines
 * scouted; missing or dead vines over the slots, whose stand is known whether or not anyone looked.
 */
import { wilsonInterval, type ProportionInterval } from '@/lib/viticulture';
import { isFindingKind, kindLabel } from '@/lib/labels';
import { SOURCES } from './sources';
import { shareWorking } from './common';
import type { BlockReportInput } from './input';

/** What a kind's incidence is a share of: the vines scouted, or (for missing and dead vines) the slots. */
export type IncidenceBase = 'vines-scouted' | 'slots';

export interface KindIncidence {
  kind: string;
  label: string;
  vinesAffected: number;
  vinesRecorded: number;
  base: IncidenceBase;
  /** The count the incidence is a share of. */
  outOf: number;
  observations: number;
  incidence: ProportionInterval;
  /** The working in words. */
  how: string;
}

export interface RowIncidence {
  row: number;
  vinesScouted: number;
  slots: number;
  kinds: Record<string, { affected: number; outOf: number; incidence: ProportionInterval }>;
}

export interface IncidenceSection {
  kinds: KindIncidence[];
  rows: RowIncidence[];
  /** The count missing and dead vines are a share of. */
  slots: number;
  source: string;
}

export const baseOf = (kind: string): IncidenceBase => (kind === 'missing-vine' ? 'slots' : 'vines-scouted');

const baseWords = (base: IncidenceBase) => (base === 'slots' ? 'slots in the block' : 'vines scouted');

export function incidenceSection(input: BlockReportInput): IncidenceSection & { vinesScouted: number } {
  const byRow = new Map(input.scoutedRows.map((r) => [r.row, r]));
  const vinesScouted = input.scoutedRows.reduce((a, r) => a + r.vines, 0);
  const slots = input.scoutedRows.reduce((a, r) => a + r.slots, 0);
  const totals = new Map<string, { affected: number; recorded: number; observations: number }>();
  const rows = new Map<number, RowIncidence>(
    input.scoutedRows.filter((r) => r.vines > 0).map((r) => [r.row, { row: r.row, vinesScouted: r.vines, slots: r.slots, kinds: {} }]),
  );
  for (const r of input.kindRows) {
    if (!isFindingKind(r.kind)) continue;
    const t = totals.get(r.kind) ?? { affected: 0, recorded: 0, observations: 0 };
    t.affected += r.affected;
    t.recorded += r.recorded;
    t.observations += r.observations;
    totals.set(r.kind, t);
    const counts = byRow.get(r.row);
    const outOf = baseOf(r.kind) === 'slots' ? (counts?.slots ?? 0) : (counts?.vines ?? 0);
    if (!counts || outOf === 0) continue;
    const row = rows.get(r.row) ?? { row: r.row, vinesScouted: counts.vines, slots: counts.slots, kinds: {} };
    row.kinds[r.kind] = { affected: r.affected, outOf, incidence: wilsonInterval(Math.min(r.affected, outOf), outOf) };
    rows.set(r.row, row);
  }
  const kinds: KindIncidence[] = [];
  for (const [kind, t] of totals) {
    const base = baseOf(kind);
    const outOf = base === 'slots' ? slots : vinesScouted;
    if (outOf === 0) continue;
    const affected = Math.min(t.affected, outOf);
    const incidence = wilsonInterval(affected, outOf);
    kinds.push({
      kind,
      label: kindLabel(kind),
      vinesAffected: t.affected,
      vinesRecorded: t.recorded,
      base,
      outOf,
      observations: t.observations,
      incidence,
      how: `${shareWorking(affected, outOf, `${baseWords(base)} had it at "watch" or worse`, incidence)}`,
    });
  }
  kinds.sort((a, b) => b.incidence.estimate - a.incidence.estimate || a.label.localeCompare(b.label));
  return { vinesScouted, slots, kinds, rows: [...rows.values()].sort((a, b) => a.row - b.row), source: SOURCES.wilson };
}
