import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { getVine } from '@/lib/server/queries/grid';
import { positionParams } from '@/lib/validation/params';
import { vinePanel } from '../vine-panel';

/** GET /api/vines/:positionId — one vine's address, status, history, photos, plan, flags and comments. */
export const GET = memberRoute({ params: positionParams }, async (member, { params }) => {
  const vine = await getVine(db(), member.organisationId, params.positionId);
  if (!vine) throw new AppError('not-found', 'There is no such vine in your organisation.');
  return vinePanel(member, vine);
});
