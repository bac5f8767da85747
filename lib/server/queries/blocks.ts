import 'server-only';
import type { Db } from '@/lib/server/db';

export interface BlockRow {
  id: string;
  organisation_id: string;
  name: string;
  variety: string;
  clone: string | null;
  rootstock: string | null;
  planting_year: number | null;
  training_system: 'cane' | 'spur' | 'other';
  row_spacing_m: string;
  vine_spacing_m: string;
  row_count: number;
  vines_per_row: number;
  vines_per_panel: number | null;
  first_row: number;
  row_order: 'ascending' | 'descending';
  position_origin: string | null;
  row_bearing_deg: number | null;
  notes: string | null;
  archived_at: Date | null;
  created_at: Date;
  updated_at: Date;
}

/** A block of this organisation (archived ones too), or undefined: never another organisation's. */
export function getBlock(db: Db, organisationId: string, blockId: string) {
  return db<BlockRow>('blocks').where({ id: blockId, organisation_id: organisationId }).first();
}

export function listBlockRows(db: Db, blockId: string) {
  return db('block_rows').where({ block_id: blockId }).orderBy('row_number').select<{ row_number: number; vine_count: number }[]>('row_number', 'vine_count');
}

export interface PositionRow {
  id: string;
  row_number: number;
  position: number;
  status: 'planted' | 'missing' | 'dead' | 'replant';
  replant_year: number | null;
}

export function listPositions(db: Db, blockId: string, rowNumber?: number) {
  const q = db('vine_positions').where('block_id', blockId);
  if (rowNumber !== undefined) q.andWhere('row_number', rowNumber);
  return q.orderBy(['row_number', 'position']).select<PositionRow[]>('id', 'row_number', 'position', 'status', 'replant_year');
}
