import { z } from 'zod';

export const samplingPlanSchema = z.strictObject({
  blockId: z.uuid('Choose a block'),
  name: z.string().trim().min(2, 'Give the plan a name').max(120),
  count: z.number().int().min(1, 'At least one vine').max(2000, 'At most 2,000 vines per plan'),
  seed: z
    .number()
    .int()
    .min(0)
    .max(2 ** 31 - 1)
    .optional(),
  avoidRowEnds: z.number().int().min(0).max(20).default(2),
});
