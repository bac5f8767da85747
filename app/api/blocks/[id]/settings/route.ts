import { memberRoute } from '@/lib/server/http';
import { loadBlockSettings, saveBlockSettings } from '@/lib/server/services/settings';
import { idParams } from '@/lib/validation/params';
import { settingsBodySchema } from '@/lib/validation/settings';

const params = idParams('a block');

/** A block's judgement settings over the organisation's; any member may read them. */
export const GET = memberRoute({ params }, async (member, { params }) => loadBlockSettings(member, params.id));

export const PUT = memberRoute({ permission: 'manage-organisation', body: settingsBodySchema, params }, async (member, { params, body }) =>
  saveBlockSettings(member, params.id, body.overrides),
);
