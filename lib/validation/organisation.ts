/** Organisation-wide settings a manager chooses. */
import { z } from 'zod';

export const seasonStartSchema = z.object({
  seasonStartMonth: z.coerce.number('Choose a month').int('Choose a month').min(1, 'Choose a month').max(12, 'Choose a month'),
});
