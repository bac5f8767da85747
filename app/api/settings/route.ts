import type { SettingsView } from '@/lib/contracts/settings';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { loadOrganisationSettings, saveOrganisationSettings } from '@/lib/server/services/settings';
import { settingsBodySchema } from '@/lib/validation/settings';

const response = responds<SettingsView>();

/** The organisation's judgement settings, each with its default and source; any member may read them. */
export const GET = memberRoute({ response }, async (member) => loadOrganisationSettings(member));

export const PUT = memberRoute({ permission: 'manage-organisation', body: settingsBodySchema, response }, async (member, { body }) =>
  saveOrganisationSettings(member, body.overrides),
);
