'use server';

import { revalidatePath } from 'next/cache';
import { db } from '@/lib/server/db';
import { memberAction } from '@/lib/server/http';
import { setPayBasis } from '@/lib/server/queries/row-work';
import { payBasisSchema } from '@/lib/validation/row-work';

export const savePayBasis = memberAction('manage-organisation', payBasisSchema, async (member, input) => {
  await setPayBasis(db(), member.organisationId, input);
  revalidatePath('/work');
  return input.basis === 'hourly'
    ? `Row work is now costed by the hour${input.hourlyRate === null ? ', once a rate is entered' : ` at ${input.hourlyRate} a person-hour`}.`
    : `Row work is now costed at a piece rate${input.pieceRatePerVine === null ? ', once a rate is entered' : ` of ${input.pieceRatePerVine} a vine`}.`;
});
