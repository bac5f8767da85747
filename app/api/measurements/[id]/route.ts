import { answersRaw } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { idParams } from '@/lib/validation/params';
import { removeMeasurement } from '@/lib/server/services/reports';

/** DELETE /api/measurements/:id — managers remove any entry, others their own. */
export const DELETE = memberRoute({ permission: 'edit-own-observation', params: idParams('an entry'), response: answersRaw }, async (member, { params }) => {
  await removeMeasurement(member, params.id);
  return new Response(null, { status: 204 });
});
