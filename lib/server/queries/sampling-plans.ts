import 'server-only';
import type { SamplingPlanView } from '@/lib/contracts/plans';
import type { Db } from '@/lib/server/db';

export function listSamplingPlans(db: Db, organisationId: string, blockId?: string) {
  const q = db('sampling_plans').where({ organisation_id: organisationId }).orderBy('created_at', 'desc').select<SamplingPlanView<Date>[]>({
    id: 'id',
    blockId: 'block_id',
    name: 'name',
    seed: 'seed',
    options: 'options',
    addresses: 'addresses',
    createdAt: 'created_at',
  });
  if (blockId) q.andWhere({ block_id: blockId });
  return q;
}

export async function insertSamplingPlan(
  db: Db,
  p: { organisationId: string; blockId: string; name: string; seed: number; options: unknown; addresses: unknown; createdBy: string },
) {
  const [row] = await db('sampling_plans')
    .insert({
      organisation_id: p.organisationId,
      block_id: p.blockId,
      name: p.name,
      seed: p.seed,
      options: JSON.stringify(p.options),
      addresses: JSON.stringify(p.addresses),
      created_by: p.createdBy,
    })
    .returning('id');
  return row.id as string;
}
