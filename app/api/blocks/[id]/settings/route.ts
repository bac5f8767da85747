import type { SettingsView } from '@/lib/contracts/settings';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { loadBlockSettings, saveBlockSettings } from '@/lib/server/services/settings';
import { idParams } from '@/lib/validation/params';
import { settingsBodySchema } from '@/lib/validation/settings';

const params = idParams('a block');

const response = responds<SettingsView>();

/** A block's judgement settings over the organisation's; any member may read them. */
export const GET = memberRoute({ params, response }, async (member, { params }) => loadBlockSettings(member, params.id));

export const PUT = memberRoute({ permission: 'manage-organisation', body: settingsBodySchema, params, response }, async (member, { params, body }) =>
  saveBlockSettings(member, params.id, body.overrides),
);
