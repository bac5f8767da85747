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

/** What the phone's block list shows of each block. */
export type BlockSummary = Pick<BlockView, 'id' | 'name' | 'variety' | 'rowCount' | 'vineCount'>;

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

export interface BlockRowView {
  row: number;
  vineCount: number;
  counts: StatusCounts;
}

export interface BlockDetailView {
  block: BlockView;
  rows: BlockRowView[];
}

export interface RowVineCount {
  row: number;
  vineCount: number;
}

export interface SlotView {
  row: number;
  position: number;
  status: SlotStatus;
  replantYear: number | null;
}

export interface SlotList {
  blockId: string;
  vinesPerPanel: number | null;
  positions: SlotView[];
}

/** One planting slot with every vine that has stood in it, the current one last. */
export interface SlotDetail {
  slot: SlotView;
  vines: { plantingYear: number | null; clone: string | null; rootstock: string | null; removedYear: number | null; removalReason: string | null }[];
}
