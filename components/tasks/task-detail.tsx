'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import Link from 'next/link';
import { useState } from 'react';
import { apiGet, apiSend, ApiError } from '@/lib/api-client';
import { CommentThread } from '@/components/comments/comment-thread';
import { memberLabel, useCrew } from '@/components/tasks/use-crew';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice, Select } from '@/components/ui/field';
import { cn } from '@/lib/cn';
import type { TaskDetail as TaskDetailView } from '@/lib/contracts/tasks';
import { formatDay, vineAddress } from '@/lib/grid/labels';
import { REASON_LABELS, type FlagReason } from '@/lib/validation/flag';
import { TASK_PRIORITIES, type TaskPriority, type UpdateTaskInput } from '@/lib/validation/task';

/** One task: its vines and why each is in it, who did what, the thread, and the manager's controls. */
export function TaskDetail({ initial, canManage }: { initial: TaskDetailView; canManage: boolean }) {
  const id = initial.task.id;
  const detail = useQuery({ queryKey: ['task', id], queryFn: () => apiGet<TaskDetailView>(`/api/tasks/${id}`), initialData: initial });
  const { task, items } = detail.data;
  const day = (iso: string) => formatDay(iso.length === 10 ? `${iso}T12:00:00Z` : iso);

  return (
    <div className="flex flex-col gap-6">
      <div>
        <p className="text-bark-soft">
          <Link href="/tasks" className="underline">
            Tasks
          </Link>{' '}
          · {task.blockName}
        </p>
        <h1 className="text-3xl font-extrabold">{task.title}</h1>
        <p className="mt-1" data-testid="task-summary">
          <span className="font-bold capitalize">{task.status}</span> · {task.assigneeName ?? 'Nobody'} · due {task.dueOn ? day(task.dueOn) : '—'}
          {task.overdue && <span className="font-bold text-alarm"> (overdue)</span>} · <span className="capitalize">{task.priority}</span> priority ·{' '}
          {task.vinesDone} of {task.vines} vines done
        </p>
        {task.note && <p className="mt-1 italic">“{task.note}”</p>}
        <p className="text-sm text-bark-soft">
          Made by {task.createdByName ?? 'someone'} on {day(task.createdAt)}
          {task.closedAt ? `, ${task.status} on ${day(task.closedAt)}` : ''}.
        </p>
      </div>

      {canManage && task.status === 'open' && <TaskControls id={id} task={task} />}

      <section aria-labelledby="vines-heading">
        <h2 id="vines-heading" className="mb-2 text-xl font-bold">
          Vines, in walking order
        </h2>
        <ol className="flex flex-col gap-2">
          {items.map((i) => (
            <li
              key={i.positionId}
              className={cn('rounded-lg border-2 bg-panel p-3', i.status === 'done' ? 'border-rootstock' : 'border-line')}
              data-testid="task-item"
            >
              <div className="flex flex-wrap items-center gap-x-3">
                <Link href={`/grid/${task.blockId}?row=${i.row}&position=${i.position}`} className="font-bold text-rootstock underline">
                  {vineAddress(i.row, i.position, task.vinesPerPanel)}
                </Link>
                <span>{i.flags.map((f) => REASON_LABELS[f.reason as FlagReason] ?? f.reason).join(', ')}</span>
                <span className={cn('ml-auto font-bold', i.status === 'done' && 'text-rootstock')}>
                  {i.status === 'done' ? `✓ done${i.doneByName ? ` by ${i.doneByName}` : ''}${i.doneAt ? ` on ${day(i.doneAt)}` : ''}` : 'to do'}
                </span>
              </div>
              {i.flags
                .filter((f) => f.note)
                .map((f) => (
                  <p key={f.id} className="text-sm italic">
                    “{f.note}”
                  </p>
                ))}
              {i.note && <p className="text-sm">Work note: {i.note}</p>}
              {i.observationId && (
                <Link href={`/grid/${task.blockId}?row=${i.row}&position=${i.position}`} className="text-sm underline">
                  Photo of the work on the vine’s page
                </Link>
              )}
            </li>
          ))}
        </ol>
      </section>

      <section aria-labelledby="thread-heading">
        <h2 id="thread-heading" className="mb-2 text-xl font-bold">
          Comments
        </h2>
        <CommentThread subject="task" subjectId={id} label="Comments on this task" />
      </section>
    </div>
  );
}

function TaskControls({ id, task }: { id: string; task: TaskDetailView['task'] }) {
  const queryClient = useQueryClient();
  const crew = useCrew();
  const [assigneeId, setAssigneeId] = useState(task.assigneeId ?? '');
  const [dueOn, setDueOn] = useState(task.dueOn ?? '');
  const [priority, setPriority] = useState<TaskPriority>(task.priority);
  const change = useMutation({
    mutationFn: (body: UpdateTaskInput) => apiSend<TaskDetailView>('PATCH', `/api/tasks/${id}`, body),
    onSuccess: (data) => {
      queryClient.setQueryData(['task', id], data);
      void queryClient.invalidateQueries({ queryKey: ['tasks'] });
    },
  });
  const fields = change.error instanceof ApiError ? (change.error.fields ?? {}) : {};

  return (
    <section aria-labelledby="manage-heading" className="flex flex-col gap-3 rounded-2xl border-2 border-line bg-panel p-4">
      <h2 id="manage-heading" className="text-xl font-bold">
        Change the task
      </h2>
      <form
        className="grid gap-3 sm:grid-cols-3 sm:items-end"
        onSubmit={(e) => {
          e.preventDefault();
          change.mutate({
            ...(assigneeId && assigneeId !== task.assigneeId ? { assigneeId } : {}),
            ...(dueOn && dueOn !== task.dueOn ? { dueOn } : {}),
            ...(priority !== task.priority ? { priority } : {}),
          });
        }}
      >
        <Field id="detail-assignee" label="Assigned to" error={fields.assigneeId?.[0]}>
          <Select id="detail-assignee" value={assigneeId} onChange={(e) => setAssigneeId(e.target.value)}>
            {(crew.data ?? [])
              .filter((m) => m.role === 'pruner' || m.role === 'manager' || m.userId === task.assigneeId)
              .map((m) => (
                <option key={m.userId} value={m.userId}>
                  {memberLabel(m)} ({m.role})
                </option>
              ))}
          </Select>
        </Field>
        <Field id="detail-due" label="Due" error={fields.dueOn?.[0]}>
          <Input id="detail-due" type="date" value={dueOn} onChange={(e) => setDueOn(e.target.value)} />
        </Field>
        <Field id="detail-priority" label="Priority" error={fields.priority?.[0]}>
          <Select id="detail-priority" value={priority} onChange={(e) => setPriority(e.target.value as TaskPriority)}>
            {TASK_PRIORITIES.map((p) => (
              <option key={p} value={p}>
                {p[0]!.toUpperCase() + p.slice(1)}
              </option>
            ))}
          </Select>
        </Field>
        <div className="flex flex-wrap gap-2 sm:col-span-3">
          <Button type="submit" disabled={change.isPending}>
            Save changes
          </Button>
          <Button
            type="button"
            variant="danger"
            disabled={change.isPending}
            onClick={() => window.confirm('Cancel this task? Its flags go back to the open list.') && change.mutate({ status: 'cancelled' })}
          >
            Cancel the task
          </Button>
        </div>
      </form>
      {change.isError && <Notice tone="error">{change.error.message}</Notice>}
      {change.isSuccess && <Notice tone="ok">Saved. A new assignee is told by e-mail.</Notice>}
    </section>
  );
}
