import 'server-only';
import type { Db } from '@/lib/server/db';
import type { SettingsOverride } from '@/lib/viticulture';

export interface StoredOverride {
  overrides: SettingsOverride;
  updatedBy: string | null;
  updatedByName: string | null;
  updatedAt: Date;
}

const audit = { overrides: 's.overrides', updatedBy: 's.updated_by', updatedByName: 'u.name', updatedAt: 's.updated_at' };

export async function getOrganisationOverride(db: Db, organisationId: string): Promise<StoredOverride | undefined> {
  return db('organisation_settings as s').leftJoin('users as u', 'u.id', 's.updated_by').where('s.organisation_id', organisationId).first(audit);
}

export async function getBlockOverride(db: Db, organisationId: string, blockId: string): Promise<StoredOverride | undefined> {
  return db('block_settings as s')
    .leftJoin('users as u', 'u.id', 's.updated_by')
    .where({ 's.organisation_id': organisationId, 's.block_id': blockId })
    .first(audit);
}

/** Every block override of the organisation, by block id. */
export async function listBlockOverrides(db: Db, organisationId: string, blockIds?: readonly string[]): Promise<Map<string, SettingsOverride>> {
  const q = db('block_settings').where({ organisation_id: organisationId });
  if (blockIds) q.whereIn('block_id', [...blockIds]);
  const rows: { block_id: string; overrides: SettingsOverride }[] = await q.select('block_id', 'overrides');
  return new Map(rows.map((r) => [r.block_id, r.overrides]));
}

export async function saveOrganisationOverride(db: Db, organisationId: string, overrides: SettingsOverride, userId: string) {
  await db('organisation_settings')
    .insert({ organisation_id: organisationId, overrides: JSON.stringify(overrides), updated_by: userId, updated_at: db.fn.now() })
    .onConflict('organisation_id')
    .merge(['overrides', 'updated_by', 'updated_at']);
}

export async function saveBlockOverride(db: Db, organisationId: string, blockId: string, overrides: SettingsOverride, userId: string) {
  await db('block_settings')
    .insert({ block_id: blockId, organisation_id: organisationId, overrides: JSON.stringify(overrides), updated_by: userId, updated_at: db.fn.now() })
    .onConflict('block_id')
    .merge(['overrides', 'updated_by', 'updated_at']);
}

/** Holds the organisation's row, so an organisation change and a block change are checked one after the other. */
export async function lockOrganisationSettings(db: Db, organisationId: string) {
  await db('organisations').where({ id: organisationId }).forUpdate().first('id');
}
