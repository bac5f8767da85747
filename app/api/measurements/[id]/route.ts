import { memberRoute } from '@/lib/server/http';
import { removeMeasurement } from '@/lib/server/services/reports';

/** DELETE /api/measurements/:id — managers remove any entry, others their own. */
export const DELETE = memberRoute({ permission: 'edit-own-observation' }, async (member, { params }) => {
  await removeMeasurement(member, String(params.id));
  return new Response(null, { status: 204 });
});
