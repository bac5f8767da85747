/** The phone's reads: what /api/field/blocks/** answer (the service worker keeps the last answer). */
import type { ObservationKind, ViticultureSettings } from '@/lib/viticulture';
import type { RowWorkPass } from '@/lib/work/passes';
import type { TrainingSystem } from '@/lib/validation/block';

export interface FieldLayout {
  block: {
    id: string;
    name: string;
    variety: string;
    trainingSystem: TrainingSystem;
    vinesPerPanel: number | null;
    rowCount: number;
    positionOrigin: string | null;
    unitSystem: 'metric' | 'imperial';
    /** For the bud-load check of a bud target; absent from a copy cached before it was sent. */
    vineSpacingM?: number;
  };
  /** `statuses` holds one letter per slot: P planted, M missing, D dead, R replant. */
  rows: { row: number; vineCount: number; statuses: string }[];
  /** [row, position, worst open severity, open findings] */
  findings: [number, number, number, number][];
  sprays: { id: string; product: string; appliedAt: string; reiHours: number; reentryAt: string }[];
  plans: { id: string; name: string; addresses: { row: number; position: number }[] }[];
  /** The block's effective judgement settings; absent from a copy cached before they were sent. */
  settings?: ViticultureSettings;
  fetchedAt: string;
}

/** A vine's recent observations, for the stepper's "what is known here" list. */
export interface FieldVineHistory {
  observations: { id: string; kind: ObservationKind; severity: number; observedAt: string; note: string }[];
}

/** Rows done end to end this season, per pass. */
export interface DoneRows {
  season: number;
  done: Partial<Record<RowWorkPass, number[]>>;
  fetchedAt: string;
}
