/**
 * Row work as the phone sends it to POST /api/sync/row-work (DESIGN.md, "Row work"): a pass over
 * a row, or a run of its positions, by a crew. Same once-only rules as observations.
 */
import { z } from 'zod';
import { SYNC_BATCH_LIMIT } from '@/lib/contracts/sync';
import { PAY_BASES } from '@/lib/work/cost';
import { ROW_WORK_PASSES } from '@/lib/work/passes';

const position = z.number().int('Must be a whole number').min(1, 'Positions start at 1').max(10000, 'At most 10000');
const when = z.iso.datetime({ offset: true, message: 'Must be an ISO 8601 time' });

export const rowWorkRecordSchema = z
  .strictObject({
    id: z.uuid({ version: 'v4', message: 'Must be a UUID v4 made on the device' }),
    blockId: z.uuid('Must be a block id'),
    row: z.number().int('Must be a whole number').min(1, 'Rows start at 1').max(10000, 'At most 10000'),
    pass: z.enum(ROW_WORK_PASSES, `Must be one of ${ROW_WORK_PASSES.join(', ')}`),
    fromPosition: position.optional(),
    toPosition: position.optional(),
    crewSize: z.number().int('Must be a whole number').min(1, 'A crew has at least 1 person').max(200, 'At most 200 people'),
    personHours: z.number().gt(0, 'Person-hours must be above 0').max(5000, 'At most 5000 person-hours'),
    startedAt: when.optional(),
    finishedAt: when,
    note: z.string().max(2000, 'Notes are limited to 2,000 characters').default(''),
  })
  .superRefine((r, ctx) => {
    if (r.fromPosition !== undefined && r.toPosition !== undefined && r.toPosition < r.fromPosition) {
      ctx.addIssue({ code: 'custom', message: 'The run must end at or after its first vine', path: ['toPosition'] });
    }
    if (r.startedAt && Date.parse(r.startedAt) > Date.parse(r.finishedAt)) {
      ctx.addIssue({ code: 'custom', message: 'The start must be before the finish', path: ['startedAt'] });
    }
    if (Date.parse(r.finishedAt) > Date.now() + 24 * 3600 * 1000) ctx.addIssue({ code: 'custom', message: 'Cannot be in the future', path: ['finishedAt'] });
    // A whole crew cannot log more hours than it has people for the day (with margin for a late finish).
    if (r.crewSize >= 1 && r.personHours > r.crewSize * 24)
      ctx.addIssue({ code: 'custom', message: `At most ${r.crewSize * 24} person-hours for a crew of ${r.crewSize}`, path: ['personHours'] });
  });

export type RowWorkRecord = z.infer<typeof rowWorkRecordSchema>;

export const syncRowWorkSchema = z.strictObject({
  records: z.array(z.unknown()).max(SYNC_BATCH_LIMIT, `At most ${SYNC_BATCH_LIMIT} records per request`),
});

export const progressQuerySchema = z.strictObject({
  season: z
    .string()
    .regex(/^\d{4}$/, 'Must be a year, like 2026')
    .transform(Number)
    .optional(),
});

const rate = z.union([z.literal('').transform(() => null), z.coerce.number('Must be a number').min(0, 'Cannot be negative').max(100000, 'At most 100000')]);

/** The manager's pay-basis form (a plain object: the form data carries the framework's own fields too). */
export const payBasisSchema = z.object({
  basis: z.enum(PAY_BASES, 'Choose hourly or piece rate'),
  hourlyRate: rate,
  pieceRatePerVine: rate,
});

export const rowWorkExportQuerySchema = progressQuerySchema.extend({
  blockId: z.uuid('Must be the id of a block').optional(),
});
