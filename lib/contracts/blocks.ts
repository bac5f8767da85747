/** Blocks: what /api/blocks/** answer. The request schemas stay in lib/validation/block.ts. */
import type { SlotStatus, TrainingSystem } from '@/lib/validation/block';

export { TRAINING_SYSTEMS, SLOT_STATUSES, type SlotStatus, type TrainingSystem } from '@/lib/validation/block';

export type StatusCounts = Record<SlotStatus, number>;

export interface BlockView {
  id: string;
  name: string;
  variety: string;
  clone: string | null;
  rootstock: string | null;
  plantingYear: number | null;
  trainingSystem: TrainingSystem;
  rowSpacingM: number;
  vineSpacingM: number;
  rowCount: number;
  vinesPerRow: number;
  vinesPerPanel: number | null;
  firstRow: number;
  rowOrder: 'ascending' | 'descending';
  positionOrigin: string | null;
  rowBearingDeg: number | null;
  notes: string | null;
  archivedAt: string | null;
  updatedAt: string;
  /** Planting slots, whatever stands in them. */
  vineCount: number;
  counts: StatusCounts;
  /** Slots × row spacing × vine spacing: the planted area, headlands left out. */
  areaM2: number;
  vinesPerHa: number;
  vinesPerAcre: number;
}

export interface BlockList {
  blocks: BlockView[];
}

export interface BlockOne {
  block: BlockView;
}

/** What a layout import would change (preview) or changed (apply). */
export interface LayoutSummary {
  applied: boolean;
  rows: { before: number; after: number; added: number[]; removed: number[]; resized: { row: number; from: number; to: number }[] };
  slots: { before: number; after: number; added: number; removed: number; statusChanged: number };
  statusChanges: { from: SlotStatus; to: SlotStatus; count: number }[];
  after: StatusCounts;
}

export interface LayoutImportAnswer {
  summary: LayoutSummary;
}
