/** The grid, the vine panel and the photo log: what /api/grid, /api/vines and /api/photos answer. */
import type { Slot } from '@/lib/grid/cells';
import type { GridFilters } from '@/lib/grid/filters';
import type { GridSummary } from '@/lib/grid/summary';
import type { VinePlanReading } from '@/lib/grid/vine-plan';
import type { TrainingSystem } from '@/lib/validation/block';

export interface GridBlock {
  id: string;
  name: string;
  variety: string;
  trainingSystem: TrainingSystem;
  rowCount: number;
  vinesPerRow: number;
  vinesPerPanel: number | null;
  rowOrder: 'ascending' | 'descending';
  positionOrigin: string | null;
}

export interface GridResponse {
  block: GridBlock;
  filters: GridFilters;
  rows: number[];
  /** One string per row, one letter per vine: lib/grid/cells.ts packRow. */
  cells: string[];
  summary: GridSummary;
}

/** One planting slot with its block, as the vine panel heads it. */
export interface VineRow {
  positionId: string;
  blockId: string;
  blockName: string;
  trainingSystem: TrainingSystem;
  /** Metres between vines in the row: a bilateral cordon fills it, and bud load is read per length of it. */
  vineSpacingM: number;
  vinesPerPanel: number | null;
  positionOrigin: string | null;
  row: number;
  position: number;
  status: Exclude<Slot, 'none'>;
  replantYear: number | null;
}

export interface VinePhoto<T = string> {
  id: string;
  width: number | null;
  height: number | null;
  takenAt: T;
}

/** One live observation of a vine. `T` is the time type: Date on the server, ISO text on the wire. */
export interface VineObservation<T = string> {
  id: string;
  kind: string;
  data: Record<string, unknown>;
  note: string;
  observedAt: T;
  severity: number;
  status: 'open' | 'closed';
  closedAt: T | null;
  recordedBy: string | null;
  recordedByName: string | null;
}

export interface Planting {
  plantingYear: number | null;
  clone: string | null;
  rootstock: string | null;
  removedYear: number | null;
  removalReason: string | null;
}

/** A flag or a comment on the vine, one line each. */
export interface VineNote<T = string> {
  id: string;
  text: string;
  by: string | null;
  at: T;
}

export interface VinePanelResponse {
  vine: VineRow;
  plantings: Planting[];
  observations: (VineObservation & { summary: string; photos: VinePhoto[] })[];
  plan: VinePlanReading;
  flags: VineNote[];
  comments: VineNote[];
  units: 'metric' | 'imperial';
  walkUrl: string;
  gridUrl: string;
}

export type PanelObservation = VinePanelResponse['observations'][number];

export interface PhotoLogItem {
  id: string;
  thumbUrl: string;
  fullUrl: string;
  width: number | null;
  height: number | null;
  takenAt: string;
  observation: { id: string; kind: string; severity: number; status: 'open' | 'closed'; note: string; observedAt: string; summary: string };
  block: { id: string; name: string };
  row: number;
  position: number;
  positionId: string;
  recordedByName: string | null;
  gridUrl: string;
}

export interface PhotoLogResponse {
  photos: PhotoLogItem[];
  nextCursor: string | null;
}
