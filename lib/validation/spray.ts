import { z } from 'zod';

export const spraySchema = z.strictObject({
  blockId: z.uuid('Choose a block'),
  product: z.string().trim().min(2, 'Name the product as on its label').max(200),
  appliedAt: z.iso.datetime({ offset: true, message: 'When did the application end?' }),
  // The label's restricted-entry interval; never a default.
  reiHours: z
    .number('Enter the REI from the label, in hours')
    .min(0, 'Cannot be negative')
    .max(24 * 90, 'Check the label: more than 90 days?'),
  notes: z.string().trim().max(1000).optional(),
});
