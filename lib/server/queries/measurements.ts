import 'server-only';
import type { SeasonBounds } from '@/lib/reports/season';
import type { Db } from '@/lib/server/db';
import type { MeasurementKind, MeasurementView } from '@/lib/validation/measurement';

export interface MeasurementInsert {
  organisation_id: string;
  block_id: string;
  kind: MeasurementKind;
  row_number: number;
  position: number | null;
  position_id: string | null;
  vines: number;
  weight_kg: number;
  clusters: number | null;
  measured_on: string;
  note: string;
  recorded_by: string;
}

const columns = (db: Db) => ({
  id: 'm.id',
  blockId: 'm.block_id',
  kind: 'm.kind',
  row: 'm.row_number',
  position: 'm.position',
  vines: 'm.vines',
  weightKg: db.raw('m.weight_kg::float8'),
  clusters: 'm.clusters',
  measuredOn: db.raw(`to_char(m.measured_on, 'YYYY-MM-DD')`),
  note: 'm.note',
  recordedBy: 'm.recorded_by',
  recordedByName: db.raw('coalesce(u.name, u.email)'),
  createdAt: 'm.created_at',
});

export async function insertMeasurement(db: Db, row: MeasurementInsert): Promise<string> {
  const [inserted] = await db('measurements').insert(row).returning<{ id: string }[]>('id');
  return inserted!.id;
}

export function getMeasurement(db: Db, organisationId: string, id: string): Promise<MeasurementView | undefined> {
  return db('measurements as m').leftJoin('users as u', 'u.id', 'm.recorded_by').where({ 'm.organisation_id': organisationId, 'm.id': id }).first(columns(db));
}

/** A block's weights of one season (its bounds, lib/reports/season.ts), newest first. */
export function listMeasurements(db: Db, organisationId: string, blockId: string, period: SeasonBounds): Promise<MeasurementView[]> {
  return db('measurements as m')
    .leftJoin('users as u', 'u.id', 'm.recorded_by')
    .where({ 'm.organisation_id': organisationId, 'm.block_id': blockId })
    .andWhere('m.measured_on', '>=', period.from.slice(0, 10))
    .andWhere('m.measured_on', '<', period.to.slice(0, 10))
    .orderBy([
      { column: 'm.measured_on', order: 'desc' },
      { column: 'm.created_at', order: 'desc' },
    ])
    .select(columns(db));
}

export function deleteMeasurement(db: Db, organisationId: string, id: string) {
  return db('measurements').where({ organisation_id: organisationId, id }).delete();
}

/** The organisation's single-vine yields in a period, per vine, for the spread of vine yields. */
export function listSingleVineYields(
  db: Db,
  organisationId: string,
  period: SeasonBounds,
): Promise<{ blockId: string; kgPerVine: number; measuredOn: string }[]> {
  return db('measurements as m')
    .where({ 'm.organisation_id': organisationId, 'm.kind': 'yield' })
    .whereNotNull('m.position_id')
    .andWhere('m.vines', '>', 0)
    .andWhere('m.measured_on', '>=', period.from.slice(0, 10))
    .andWhere('m.measured_on', '<', period.to.slice(0, 10))
    .select({ blockId: 'm.block_id', kgPerVine: db.raw('m.weight_kg::float8 / m.vines'), measuredOn: db.raw(`to_char(m.measured_on, 'YYYY-MM-DD')`) });
}
