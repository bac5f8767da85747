/** The rows the report queries return, and the input the block report is built from. */
import type { BlockView } from '@/lib/contracts/blocks';
import type { ObservationKind, ViticultureSettings } from '@/lib/viticulture';
import type { UnitSystem } from '@/lib/units';
import type { ReportOptions } from '@/lib/validation/report';
import type { RecordedLabour } from '@/lib/work/recorded';

/** The block facts a report reads: the Desk's own block view, not a copy of it. */
export type ReportBlock = Pick<
  BlockView,
  | 'id'
  | 'name'
  | 'variety'
  | 'clone'
  | 'rootstock'
  | 'plantingYear'
  | 'trainingSystem'
  | 'rowSpacingM'
  | 'vineSpacingM'
  | 'rowCount'
  | 'vinesPerRow'
  | 'vinesPerPanel'
>;

export interface SlotCounts {
  planted: number;
  replant: number;
  missing: number;
  dead: number;
  /** Replants planted at least `crop.bearingAfterSeasons` seasons before this one. */
  bearingReplants: number;
}

/** Per row and kind: vines with a record of the kind, those at "watch" or worse, and the records. */
export interface KindRowCount {
  row: number;
  kind: string;
  recorded: number;
  affected: number;
  observations: number;
}

/** Per row: vines scouted (any record but a missing-vine one) and planting slots. */
export interface ScoutedRow {
  row: number;
  vines: number;
  slots: number;
}

export interface MeasuredObservation {
  row: number;
  position: number;
  kind: ObservationKind;
  data: Record<string, unknown>;
  observedAt: string;
}

export interface MeasurementRow {
  kind: 'yield' | 'pruning-weight';
  season: number;
  row: number;
  /** Null for a row sample. */
  position: number | null;
  vines: number;
  weightKg: number;
  clusters: number | null;
}

/** A pruning record that carried its vine's pruning weight. */
export interface RecordedPruningWeight {
  season: number;
  row: number;
  position: number;
  weightKg: number;
}

export interface ReplantSlot {
  row: number;
  position: number;
  clone: string | null;
  rootstock: string | null;
  /** Why it is on the list: the slot's status, a scout's missing/dead record, or an open replant flag. */
  reason: 'missing' | 'dead' | 'recorded-missing' | 'recorded-dead' | 'flagged';
}

export interface TaskRow {
  id: string;
  title: string;
  status: 'open' | 'done' | 'cancelled';
  priority: string;
  dueOn: string | null;
  assignee: string | null;
  items: number;
  itemsDone: number;
  closedAt: string | null;
}

export interface PersistedVine {
  row: number;
  position: number;
  kind: string;
  before: number;
  now: number;
}

export interface BlockReportInput {
  block: ReportBlock;
  season: number;
  /** 1–12, the month the organisation's seasons start in; January when absent. */
  seasonStartMonth?: number;
  units: UnitSystem;
  slots: SlotCounts;
  kindRows: KindRowCount[];
  scoutedRows: ScoutedRow[];
  observations: number;
  measured: MeasuredObservation[];
  /** Weights of seasons season − 1 … season + 1 (Ravaz pairs a harvest with the next winter's prunings). */
  measurements: MeasurementRow[];
  recordedWeights: RecordedPruningWeight[];
  replant: ReplantSlot[];
  /** Null when the tasks table is not there (an older database). */
  tasks: TaskRow[] | null;
  /** Row work the crews recorded this season; absent when not loaded. */
  recordedLabour?: RecordedLabour | null;
  options: ReportOptions;
  settings?: ViticultureSettings;
}
