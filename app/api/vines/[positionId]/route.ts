import { isUuid } from '@/lib/grid/filters';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { getVine } from '@/lib/server/queries/grid';
import { vinePanel } from '../vine-panel';

/** GET /api/vines/:positionId — one vine's address, status, history, photos, plan, flags and comments. */
export const GET = memberRoute({}, async (member, { params }) => {
  const vine = isUuid(params.positionId) ? await getVine(db(), member.organisationId, params.positionId) : undefined;
  if (!vine) throw new AppError('not-found', 'There is no such vine in your organisation.');
  return vinePanel(member, vine);
});
