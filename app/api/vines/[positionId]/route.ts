import type { VinePanelResponse } from '@/lib/contracts/grid';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { vinePanelById } from '@/lib/server/services/grid';
import { positionParams } from '@/lib/validation/params';

/** GET /api/vines/:positionId — one vine's address, status, history, photos, plan, flags and comments. */
export const GET = memberRoute({ params: positionParams, response: responds<VinePanelResponse>() }, async (member, { params }) =>
  vinePanelById(member, params.positionId),
);
