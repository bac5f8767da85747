'use server';

import { revalidatePath } from 'next/cache';
import { db } from '@/lib/server/db';
import { memberAction } from '@/lib/server/http';
import { MONTHS, seasonBounds, seasonOf } from '@/lib/reports/season';
import { updateUnitSystem } from '@/lib/server/queries/blocks';
import { updateSeasonStartMonth } from '@/lib/server/queries/organisations';
import { unitPreferenceSchema } from '@/lib/validation/block';
import { seasonStartSchema } from '@/lib/validation/organisation';

export const saveUnitPreference = memberAction('manage-organisation', unitPreferenceSchema, async (member, input) => {
  await updateUnitSystem(db(), member.organisationId, input.unitSystem);
  revalidatePath('/', 'layout');
  return input.unitSystem === 'metric'
    ? 'Lengths now show in metres and millimetres, areas in hectares.'
    : 'Lengths now show in feet and inches, areas in acres.';
});

export const saveSeasonStart = memberAction('manage-organisation', seasonStartSchema, async (member, input) => {
  await updateSeasonStartMonth(db(), member.organisationId, input.seasonStartMonth);
  revalidatePath('/', 'layout');
  const season = seasonOf(new Date(), input.seasonStartMonth);
  const { from, to } = seasonBounds(season, input.seasonStartMonth);
  return `Seasons now start in ${MONTHS[input.seasonStartMonth - 1]}: season ${season} runs from ${from.slice(0, 10)} up to ${to.slice(0, 10)}.`;
});
