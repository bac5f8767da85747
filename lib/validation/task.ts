/**
 * Tasks: made from flags by a manager on the desk, worked vine by vine on the phone. A task update
 * is the phone's record that one vine of a task is done, with the same once-only rules as
 * observations (device-made id, duplicate or conflict on a resend).
 */
import { z } from 'zod';
import { SYNC_BATCH_LIMIT } from '@/lib/contracts/sync';

export const TASK_PRIORITIES = ['low', 'normal', 'high'] as const;
export type TaskPriority = (typeof TASK_PRIORITIES)[number];

export const TASK_STATUSES = ['open', 'done', 'cancelled'] as const;
export type TaskStatus = (typeof TASK_STATUSES)[number];

const day = z.iso.date('Must be a date as YYYY-MM-DD');

export const createTasksSchema = z.strictObject({
  flagIds: z.array(z.uuid('Must be the id of a flag')).min(1, 'Choose at least one flag').max(500, 'At most 500 flags at a time'),
  assigneeId: z.uuid('Choose who does the work'),
  dueOn: day,
  priority: z.enum(TASK_PRIORITIES, 'Must be low, normal or high').default('normal'),
  title: z.string().trim().max(120, 'At most 120 characters').optional(),
  note: z.string().trim().max(2000, 'Notes are limited to 2,000 characters').default(''),
});
export type CreateTasksInput = z.infer<typeof createTasksSchema>;

export const updateTaskSchema = z
  .strictObject({
    assigneeId: z.uuid('Choose who does the work').optional(),
    dueOn: day.optional(),
    priority: z.enum(TASK_PRIORITIES, 'Must be low, normal or high').optional(),
    status: z.literal('cancelled', 'A task can only be cancelled here; it is done when its vines are').optional(),
  })
  .refine((u) => Object.values(u).some((v) => v !== undefined), { message: 'Nothing to change', path: ['_'] });
export type UpdateTaskInput = z.infer<typeof updateTaskSchema>;

export const taskListQuerySchema = z.strictObject({
  status: z.enum([...TASK_STATUSES, 'all'], 'Must be open, done, cancelled or all').default('open'),
  assignee: z.union([z.literal('me'), z.uuid('Must be the id of a person')]).optional(),
  block: z.uuid('Must be the id of a block').optional(),
  priority: z.enum(TASK_PRIORITIES, 'Must be low, normal or high').optional(),
  /** 1: include each task's vines, for the phone's offline copy. */
  items: z
    .enum(['0', '1'], 'Must be 0 or 1')
    .default('0')
    .transform((v) => v === '1'),
});

export type TaskListQuery = z.infer<typeof taskListQuerySchema>;

export const taskUpdateRecordSchema = z
  .strictObject({
    id: z.uuid({ version: 'v4', message: 'Must be a UUID v4 made on the device' }),
    taskId: z.uuid('Must be the id of a task'),
    blockId: z.uuid('Must be a block id'),
    row: z.number().int().min(1, 'Rows start at 1').max(10000),
    position: z.number().int().min(1, 'Positions start at 1').max(10000),
    note: z.string().max(2000, 'Notes are limited to 2,000 characters').default(''),
    /** The note observation that carries this work's photos, sent in the same drain before it. */
    observationId: z.uuid({ version: 'v4', message: 'Must be a UUID v4 made on the device' }).optional(),
    doneAt: z.iso.datetime({ offset: true, message: 'Must be an ISO 8601 time' }),
  })
  .superRefine((r, ctx) => {
    if (Date.parse(r.doneAt) > Date.now() + 24 * 3600 * 1000) ctx.addIssue({ code: 'custom', message: 'Cannot be in the future', path: ['doneAt'] });
  });
export type TaskUpdateRecord = z.infer<typeof taskUpdateRecordSchema>;

export const syncTaskUpdatesSchema = z.strictObject({
  taskUpdates: z.array(z.unknown()).max(SYNC_BATCH_LIMIT, `At most ${SYNC_BATCH_LIMIT} records per request`),
});

export const pruningCheckQuerySchema = z
  .strictObject({
    block: z.uuid('Must be the id of a block').optional(),
    from: day.optional(),
    to: day.optional(),
  })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: 'Must be on or after the start date', path: ['to'] });
