/**
 * A flag as the phone sends it to POST /api/sync/flags: a vine, or a run of vines in one row, that
 * needs extra care, with a reason from the list. Same once-only rules as observations.
 */
import { z } from 'zod';
import { SYNC_BATCH_LIMIT } from '@/lib/contracts/sync';

export const FLAG_REASONS = ['retrain', 'trunk-renewal', 'replant', 'lighter-bud-load', 'heavier-bud-load', 'remove-injured-wood', 'other'] as const;
export type FlagReason = (typeof FLAG_REASONS)[number];

export const REASON_LABELS: Record<FlagReason, string> = {
  retrain: 'Retrain',
  'trunk-renewal': 'Trunk renewal',
  replant: 'Replant',
  'lighter-bud-load': 'Lighter bud load',
  'heavier-bud-load': 'Heavier bud load',
  'remove-injured-wood': 'Remove injured wood',
  other: 'Other',
};

/** Longest run one flag may cover: a long run is better split by what each part needs. */
export const MAX_FLAG_RUN = 200;

export const flagRecordSchema = z
  .strictObject({
    id: z.uuid({ version: 'v4', message: 'Must be a UUID v4 made on the device' }),
    blockId: z.uuid('Must be a block id'),
    row: z.number().int().min(1, 'Rows start at 1').max(10000),
    position: z.number().int().min(1, 'Positions start at 1').max(10000),
    toPosition: z.number().int().min(1, 'Positions start at 1').max(10000).optional(),
    reason: z.enum(FLAG_REASONS, 'Choose a reason from the list'),
    note: z.string().max(2000, 'Notes are limited to 2,000 characters').default(''),
    flaggedAt: z.iso.datetime({ offset: true, message: 'Must be an ISO 8601 time' }),
  })
  .superRefine((r, ctx) => {
    const last = r.toPosition ?? r.position;
    if (last < r.position) ctx.addIssue({ code: 'custom', message: 'The run must end at or after its first vine', path: ['toPosition'] });
    if (last - r.position + 1 > MAX_FLAG_RUN) ctx.addIssue({ code: 'custom', message: `A flag covers at most ${MAX_FLAG_RUN} vines`, path: ['toPosition'] });
    if (r.reason === 'other' && !r.note.trim()) ctx.addIssue({ code: 'custom', message: 'Say what the vine needs', path: ['note'] });
    if (Date.parse(r.flaggedAt) > Date.now() + 24 * 3600 * 1000) ctx.addIssue({ code: 'custom', message: 'Cannot be in the future', path: ['flaggedAt'] });
  });

export type FlagRecord = z.infer<typeof flagRecordSchema>;

export const syncFlagsSchema = z.strictObject({
  flags: z.array(z.unknown()).max(SYNC_BATCH_LIMIT, `At most ${SYNC_BATCH_LIMIT} records per request`),
});

export const FLAG_STATUSES = ['open', 'closed', 'all'] as const;

export const flagListQuerySchema = z.strictObject({
  block: z.uuid('Must be the id of a block').optional(),
  status: z.enum(FLAG_STATUSES, 'Must be open, closed or all').default('open'),
  /** 1: only flags no open task works yet. */
  untasked: z
    .enum(['0', '1'], 'Must be 0 or 1')
    .default('0')
    .transform((v) => v === '1'),
});

/** A manager closes a flag that needs no task (or opens it again). */
export const flagUpdateSchema = z.strictObject({
  status: z.enum(['open', 'closed'], 'Must be open or closed'),
});

export type FlagListQuery = z.infer<typeof flagListQuerySchema>;
