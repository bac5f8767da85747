import 'server-only';
import type { SprayView } from '@/lib/contracts/sprays';
import type { Db } from '@/lib/server/db';

const select = (db: Db) =>
  db('sprays as s')
    .join('blocks as b', 'b.id', 's.block_id')
    .select<SprayView<Date>[]>(
      { id: 's.id', blockId: 's.block_id', blockName: 'b.name', product: 's.product', appliedAt: 's.applied_at', notes: 's.notes' },
      db.raw('s.rei_hours::float as "reiHours"'),
      db.raw(`s.applied_at + s.rei_hours * interval '1 hour' as "reentryAt"`),
    );

export function listSprays(db: Db, organisationId: string, o: { blockId?: string; limit?: number } = {}) {
  const q = select(db)
    .where('s.organisation_id', organisationId)
    .orderBy('s.applied_at', 'desc')
    .limit(o.limit ?? 200);
  if (o.blockId) q.andWhere('s.block_id', o.blockId);
  return q;
}

/** Sprays whose re-entry interval has not ended yet (or ends within `withinHours`), per block. */
export function listRecentSprays(db: Db, organisationId: string, blockId: string, withinHours = 24 * 7) {
  return select(db)
    .where({ 's.organisation_id': organisationId, 's.block_id': blockId })
    .andWhereRaw(`s.applied_at + s.rei_hours * interval '1 hour' > now() - ? * interval '1 hour'`, [withinHours])
    .orderBy('s.applied_at', 'desc');
}

/** Every spray whose re-entry interval has not ended yet, soonest to end last: the blocks no one may enter now. */
export function listSpraysInForce(db: Db, organisationId: string) {
  return select(db)
    .where('s.organisation_id', organisationId)
    .whereNull('b.archived_at')
    .andWhereRaw(`s.applied_at <= now() and s.applied_at + s.rei_hours * interval '1 hour' > now()`)
    .orderByRaw(`s.applied_at + s.rei_hours * interval '1 hour' desc`);
}

export async function insertSpray(
  db: Db,
  s: { organisationId: string; blockId: string; product: string; appliedAt: string; reiHours: number; notes?: string; recordedBy: string },
) {
  const [row] = await db('sprays')
    .insert({
      organisation_id: s.organisationId,
      block_id: s.blockId,
      product: s.product,
      applied_at: s.appliedAt,
      rei_hours: s.reiHours,
      notes: s.notes ?? null,
      recorded_by: s.recordedBy,
    })
    .returning('id');
  return row.id as string;
}
