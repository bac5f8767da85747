import { memberRoute } from '@/lib/server/http';
import { loadOrganisationSettings, saveOrganisationSettings } from '@/lib/server/services/settings';
import { settingsBodySchema } from '@/lib/validation/settings';

/** The organisation's judgement settings, each with its default and source; any member may read them. */
export const GET = memberRoute({}, async (member) => loadOrganisationSettings(member));

export const PUT = memberRoute({ permission: 'manage-organisation', body: settingsBodySchema }, async (member, { body }) =>
  saveOrganisationSettings(member, body.overrides),
);
