'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type RowSelectionState,
  type SortingState,
} from '@tanstack/react-table';
import Link from 'next/link';
import { useMemo, useState } from 'react';
import { apiGet, apiSend, ApiError } from '@/lib/api-client';
import { memberLabel, useCrew } from '@/components/tasks/use-crew';
import { Button } from '@/components/ui/button';
import { Field, FilterSelect, Input, Notice, Select } from '@/components/ui/field';
import { SortableHead } from '@/components/ui/sortable-head';
import { cn } from '@/lib/cn';
import type { FlagList, FlagView } from '@/lib/contracts/flags';
import type { CreatedTasks } from '@/lib/contracts/tasks';
import { formatDay, vineAddress } from '@/lib/grid/labels';
import { FLAG_REASONS, REASON_LABELS } from '@/lib/validation/flag';
import { TASK_PRIORITIES, type TaskPriority } from '@/lib/validation/task';

const where = (f: FlagView) =>
  f.toPosition > f.position ? `Row ${f.row}, vines ${f.position}–${f.toPosition}` : vineAddress(f.row, f.position, f.vinesPerPanel);

const inDays = (days: number) => new Date(Date.now() + days * 24 * 3600 * 1000).toISOString().slice(0, 10);

/**
 * The organisation's flags as a table. A manager ticks open flags that no task works yet and makes
 * them into tasks (one per block) for one person.
 */
export function FlagsTable({
  canManage,
  initialBlock = '',
  initialUntasked = false,
}: {
  canManage: boolean;
  initialBlock?: string;
  initialUntasked?: boolean;
}) {
  const [status, setStatus] = useState<'open' | 'closed' | 'all'>('open');
  const [block, setBlock] = useState(initialBlock);
  const [reason, setReason] = useState('');
  const [untasked, setUntasked] = useState(initialUntasked);
  const [sorting, setSorting] = useState<SortingState>([]);
  const [selection, setSelection] = useState<RowSelectionState>({});
  const list = useQuery({
    queryKey: ['flags', status],
    queryFn: () => apiGet<FlagList>(`/api/flags?status=${status}`),
  });
  const blocks = useMemo(
    () => [...new Map((list.data?.flags ?? []).map((f) => [f.blockId, f.blockName])).entries()].sort((a, b) => a[1].localeCompare(b[1])),
    [list.data],
  );
  const rows = useMemo(
    () =>
      (list.data?.flags ?? []).filter(
        (f) => (!block || f.blockId === block) && (!reason || f.reason === reason) && (!untasked || !f.taskId || f.taskStatus !== 'open'),
      ),
    [list.data, block, reason, untasked],
  );
  const selectable = (f: FlagView) => canManage && f.status === 'open' && (!f.taskId || f.taskStatus !== 'open');

  const columns = useMemo<ColumnDef<FlagView>[]>(
    () => [
      ...(canManage
        ? [
            {
              id: 'select',
              header: () => <span className="sr-only">Choose</span>,
              enableSorting: false,
              cell: ({ row }) =>
                row.getCanSelect() ? (
                  <input
                    type="checkbox"
                    className="size-6 accent-rootstock"
                    aria-label={`Choose ${REASON_LABELS[row.original.reason]} at ${row.original.blockName}, ${where(row.original)}`}
                    checked={row.getIsSelected()}
                    onChange={row.getToggleSelectedHandler()}
                  />
                ) : null,
            } satisfies ColumnDef<FlagView>,
          ]
        : []),
      { accessorKey: 'blockName', header: 'Block' },
      { id: 'where', accessorFn: (f) => f.row * 100000 + f.position, header: 'Where', cell: ({ row }) => where(row.original) },
      { accessorKey: 'reason', header: 'Needs', cell: ({ row }) => <span className="font-bold">{REASON_LABELS[row.original.reason]}</span> },
      { accessorKey: 'note', header: 'Note', enableSorting: false, cell: ({ row }) => <span className="whitespace-normal">{row.original.note}</span> },
      { accessorKey: 'flaggedByName', header: 'Flagged by' },
      { accessorKey: 'flaggedAt', header: 'On', cell: ({ row }) => formatDay(row.original.flaggedAt) },
      {
        id: 'task',
        accessorFn: (f) => f.taskTitle ?? '',
        header: 'Task',
        cell: ({ row }) =>
          row.original.taskId ? (
            <Link href={`/tasks/${row.original.taskId}`} className="text-rootstock underline">
              {row.original.taskTitle} ({row.original.taskStatus})
            </Link>
          ) : row.original.status === 'closed' ? (
            'closed'
          ) : (
            '—'
          ),
      },
    ],
    [canManage],
  );

  const table = useReactTable({
    data: rows,
    columns,
    getRowId: (f) => f.id,
    state: { sorting, rowSelection: selection },
    enableRowSelection: (row) => selectable(row.original),
    onRowSelectionChange: setSelection,
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  const chosen = rows.filter((f) => selection[f.id] && selectable(f));

  return (
    <div className="flex flex-col gap-4">
      <div className="grid gap-3 sm:grid-cols-4 sm:items-end">
        <FilterSelect
          id="flag-status"
          label="Status"
          value={status}
          onChange={setStatus}
          options={[
            ['open', 'Open'],
            ['closed', 'Closed'],
            ['all', 'All'],
          ]}
        />
        <FilterSelect id="flag-block" label="Block" value={block} onChange={setBlock} any="All blocks" options={blocks} />
        <FilterSelect
          id="flag-reason"
          label="Needs"
          value={reason}
          onChange={setReason}
          any="Anything"
          options={FLAG_REASONS.map((r) => [r, REASON_LABELS[r]] as const)}
        />
        <label className="flex min-h-touch items-center gap-2 font-bold">
          <input type="checkbox" className="size-6 accent-rootstock" checked={untasked} onChange={(e) => setUntasked(e.target.checked)} />
          Not in a task yet
        </label>
      </div>

      {list.isError && <Notice tone="error">{list.error.message}</Notice>}
      {list.isPending ? (
        <p aria-busy="true">Loading flags…</p>
      ) : (
        <div className="overflow-x-auto rounded-lg border-2 border-line bg-panel" role="region" aria-label="Flags" tabIndex={0}>
          <table className="w-full border-collapse text-left">
            <SortableHead table={table} />
            <tbody>
              {table.getRowModel().rows.map((row) => (
                <tr key={row.id} className={cn('border-b border-line', row.getIsSelected() && 'bg-rootstock-tint')} data-testid="flag-row">
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="px-3 py-2 align-top whitespace-nowrap">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
          {rows.length === 0 && <p className="p-4 text-bark-soft">{list.data?.flags.length ? 'No flag matches these filters.' : 'No flags here.'}</p>}
        </div>
      )}

      {canManage && <MakeTasks flags={chosen} onMade={() => setSelection({})} />}
    </div>
  );
}

function MakeTasks({ flags, onMade }: { flags: FlagView[]; onMade: () => void }) {
  const queryClient = useQueryClient();
  const crew = useCrew();
  const workers = (crew.data ?? []).filter((m) => m.role === 'pruner' || m.role === 'manager');
  const [assigneeId, setAssigneeId] = useState('');
  const [dueOn, setDueOn] = useState(inDays(7));
  const [priority, setPriority] = useState<TaskPriority>('normal');
  const [title, setTitle] = useState('');
  const [note, setNote] = useState('');
  const make = useMutation({
    mutationFn: () =>
      apiSend<CreatedTasks>('POST', '/api/tasks', {
        flagIds: flags.map((f) => f.id),
        assigneeId,
        dueOn,
        priority,
        ...(title.trim() ? { title: title.trim() } : {}),
        note,
      }),
    onSuccess: async () => {
      onMade();
      setTitle('');
      setNote('');
      await queryClient.invalidateQueries({ queryKey: ['flags'] });
    },
  });
  const fields = make.error instanceof ApiError ? (make.error.fields ?? {}) : {};
  const blocks = new Set(flags.map((f) => f.blockId)).size;

  return (
    <section aria-labelledby="make-heading" className="flex flex-col gap-3 rounded-2xl border-2 border-line bg-panel p-4">
      <h2 id="make-heading" className="text-xl font-bold">
        Make tasks
      </h2>
      {flags.length === 0 ? (
        <p className="text-bark-soft">Tick open flags above to turn them into work for someone. Flags of different blocks become one task per block.</p>
      ) : (
        <p>
          {flags.length} {flags.length === 1 ? 'flag' : 'flags'} chosen: {blocks === 1 ? 'one task' : `${blocks} tasks, one per block`}.
        </p>
      )}
      <form
        className="grid gap-3 sm:grid-cols-2"
        onSubmit={(e) => {
          e.preventDefault();
          make.mutate();
        }}
      >
        <Field id="task-assignee" label="Who does it" error={fields.assigneeId?.[0]}>
          <Select id="task-assignee" value={assigneeId} onChange={(e) => setAssigneeId(e.target.value)} required>
            <option value="">Choose a person…</option>
            {workers.map((m) => (
              <option key={m.userId} value={m.userId}>
                {memberLabel(m)} ({m.role})
              </option>
            ))}
          </Select>
        </Field>
        <Field id="task-due" label="Due" error={fields.dueOn?.[0]}>
          <Input id="task-due" type="date" value={dueOn} onChange={(e) => setDueOn(e.target.value)} required />
        </Field>
        <fieldset className="flex flex-col gap-1">
          <legend className="mb-1 font-bold">Priority</legend>
          <div className="flex gap-2">
            {TASK_PRIORITIES.map((p) => (
              <label
                key={p}
                className="flex min-h-touch flex-1 cursor-pointer items-center justify-center gap-2 rounded-lg border-2 border-line px-3 font-bold capitalize has-checked:border-rootstock has-checked:bg-rootstock-tint"
              >
                <input type="radio" name="priority" value={p} checked={priority === p} onChange={() => setPriority(p)} className="size-5 accent-rootstock" />
                {p}
              </label>
            ))}
          </div>
        </fieldset>
        <Field id="task-title" label="Title (optional)" error={fields.title?.[0]} hint="Left empty, it is made from the reasons and rows.">
          <Input id="task-title" value={title} onChange={(e) => setTitle(e.target.value)} maxLength={120} />
        </Field>
        <div className="sm:col-span-2">
          <Field id="task-note" label="Note for the crew (optional)" error={fields.note?.[0]}>
            <textarea
              id="task-note"
              value={note}
              onChange={(e) => setNote(e.target.value)}
              rows={2}
              maxLength={2000}
              className="rounded-lg border-2 border-line bg-panel p-2"
            />
          </Field>
        </div>
        <div className="flex flex-col gap-2 sm:col-span-2">
          <Button type="submit" disabled={flags.length === 0 || !assigneeId || make.isPending} className="self-start">
            {make.isPending ? 'Making…' : flags.length > 0 && blocks > 1 ? `Make ${blocks} tasks` : 'Make the task'}
          </Button>
          {make.isError && <Notice tone="error">{make.error.message}</Notice>}
          {make.data && (
            <Notice tone="ok">
              Made{' '}
              {make.data.tasks.map((t, i) => (
                <span key={t.id}>
                  {i > 0 && ', '}
                  <Link href={`/tasks/${t.id}`} className="font-bold underline">
                    {t.title}
                  </Link>{' '}
                  ({t.blockName}, {t.vines} {t.vines === 1 ? 'vine' : 'vines'})
                </span>
              ))}
              . The person is told by e-mail.
            </Notice>
          )}
        </div>
      </form>
    </section>
  );
}
