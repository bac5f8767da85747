'use server';

import { revalidatePath } from 'next/cache';
import { db } from '@/lib/server/db';
import { memberAction } from '@/lib/server/http';
import { updateUnitSystem } from '@/lib/server/queries/blocks';
import { unitPreferenceSchema } from '@/lib/validation/block';

export const saveUnitPreference = memberAction('manage-organisation', unitPreferenceSchema, async (member, input) => {
  await updateUnitSystem(db(), member.organisationId, input.unitSystem);
  revalidatePath('/', 'layout');
  return input.unitSystem === 'metric' ? 'Lengths now show in metres and millimetres, areas in hectares.' : 'Lengths now show in feet and inches, areas in acres.';
});
