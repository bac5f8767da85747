'use client';

import { useQuery } from '@tanstack/react-query';
import { flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type ColumnDef, type SortingState } from '@tanstack/react-table';
import Link from 'next/link';
import { useMemo, useState } from 'react';
import { apiGet } from '@/lib/api-client';
import { memberLabel, useCrew } from '@/components/tasks/use-crew';
import { Field, FilterSelect, Input, Notice } from '@/components/ui/field';
import { SortableHead } from '@/components/ui/sortable-head';
import { cn } from '@/lib/cn';
import type { TaskList, TaskView } from '@/lib/contracts/tasks';
import { formatDay } from '@/lib/grid/labels';
import { TASK_PRIORITIES, TASK_STATUSES, type TaskPriority, type TaskStatus } from '@/lib/validation/task';

const PRIORITY_RANK: Record<TaskPriority, number> = { high: 0, normal: 1, low: 2 };

const columns: ColumnDef<TaskView>[] = [
  {
    accessorKey: 'title',
    header: 'Task',
    cell: ({ row }) => (
      <Link href={`/tasks/${row.original.id}`} className="font-bold text-rootstock underline">
        {row.original.title}
      </Link>
    ),
  },
  { accessorKey: 'blockName', header: 'Block' },
  { accessorKey: 'assigneeName', header: 'Assigned to', sortUndefined: 'last' },
  {
    accessorKey: 'dueOn',
    header: 'Due',
    sortUndefined: 'last',
    cell: ({ row }) => (
      <span className={cn(row.original.overdue && 'font-bold text-alarm')}>
        {row.original.dueOn ? formatDay(`${row.original.dueOn}T12:00:00Z`) : '—'}
        {row.original.overdue ? ' (overdue)' : ''}
      </span>
    ),
  },
  {
    id: 'priority',
    accessorFn: (t) => PRIORITY_RANK[t.priority],
    header: 'Priority',
    cell: ({ row }) => <span className="capitalize">{row.original.priority}</span>,
  },
  {
    id: 'progress',
    accessorFn: (t) => (t.vines ? t.vinesDone / t.vines : 0),
    header: 'Progress',
    cell: ({ row }) => (
      <span className="flex items-center gap-2">
        <progress className="h-3 w-20 accent-rootstock" max={row.original.vines} value={row.original.vinesDone} aria-hidden />
        <span className="tabular-nums">
          {row.original.vinesDone}/{row.original.vines}
        </span>
      </span>
    ),
  },
  { accessorKey: 'status', header: 'Status', cell: ({ row }) => <span className="capitalize">{row.original.status}</span> },
];

/** The manager's task table: filter by status, person, block and priority; sort by any column. */
export function TasksTable() {
  const [status, setStatus] = useState<TaskStatus | 'all'>('open');
  const [assignee, setAssignee] = useState('');
  const [block, setBlock] = useState('');
  const [priority, setPriority] = useState('');
  const [query, setQuery] = useState('');
  const [sorting, setSorting] = useState<SortingState>([{ id: 'dueOn', desc: false }]);
  const crew = useCrew();
  const search = new URLSearchParams({ status, ...(assignee ? { assignee } : {}), ...(priority ? { priority } : {}) });
  const list = useQuery({ queryKey: ['tasks', search.toString()], queryFn: () => apiGet<TaskList>(`/api/tasks?${search}`) });
  const blocks = useMemo(
    () => [...new Map((list.data?.tasks ?? []).map((t) => [t.blockId, t.blockName])).entries()].sort((a, b) => a[1].localeCompare(b[1])),
    [list.data],
  );
  const rows = useMemo(
    () =>
      (list.data?.tasks ?? []).filter(
        (t) => (!block || t.blockId === block) && (!query || `${t.title} ${t.blockName} ${t.assigneeName ?? ''}`.toLowerCase().includes(query.toLowerCase())),
      ),
    [list.data, block, query],
  );
  const table = useReactTable({
    data: rows,
    columns,
    getRowId: (t) => t.id,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });

  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby="progress-heading">
        <h2 id="progress-heading" className="mb-2 text-xl font-bold">
          Open work by block
        </h2>
        {list.data && list.data.progress.length === 0 && <p className="text-bark-soft">No open tasks.</p>}
        <ul className="grid gap-2 sm:grid-cols-2 lg:grid-cols-4" data-testid="block-progress">
          {list.data?.progress.map((p) => (
            <li key={p.blockId} className="rounded-lg border-2 border-line bg-panel p-3">
              <p className="font-bold">{p.blockName}</p>
              <p>
                {p.openTasks} open {p.openTasks === 1 ? 'task' : 'tasks'}
                {p.overdueTasks > 0 && <span className="font-bold text-alarm"> · {p.overdueTasks} overdue</span>}
              </p>
              <progress className="h-3 w-full accent-rootstock" max={p.vines} value={p.vinesDone} aria-hidden />
              <p className="text-sm">
                {p.vinesDone} of {p.vines} vines done
              </p>
            </li>
          ))}
        </ul>
      </section>

      <div className="grid gap-3 sm:grid-cols-5 sm:items-end">
        <Field id="task-search" label="Find">
          <Input id="task-search" type="search" value={query} onChange={(e) => setQuery(e.target.value)} placeholder="Title, block, person…" />
        </Field>
        <FilterSelect<TaskStatus | 'all'>
          id="task-status"
          label="Status"
          value={status}
          onChange={setStatus}
          options={[...TASK_STATUSES.map((s) => [s, capitalised(s)] as const), ['all', 'All']]}
        />
        <FilterSelect
          id="task-person"
          label="Assigned to"
          value={assignee}
          onChange={setAssignee}
          any="Anyone"
          options={[
            ['me', 'Me'],
            ...(crew.data ?? []).filter((m) => m.role === 'pruner' || m.role === 'manager').map((m) => [m.userId, memberLabel(m)] as const),
          ]}
        />
        <FilterSelect id="task-block" label="Block" value={block} onChange={setBlock} any="All blocks" options={blocks} />
        <FilterSelect
          id="task-priority"
          label="Priority"
          value={priority}
          onChange={setPriority}
          any="Any"
          options={TASK_PRIORITIES.map((p) => [p, capitalised(p)] as const)}
        />
      </div>

      {list.isError && <Notice tone="error">{list.error.message}</Notice>}
      {list.isPending ? (
        <p aria-busy="true">Loading tasks…</p>
      ) : (
        <div className="overflow-x-auto rounded-lg border-2 border-line bg-panel" role="region" aria-label="Tasks" tabIndex={0}>
          <table className="w-full border-collapse text-left">
            <SortableHead table={table} />
            <tbody>
              {table.getRowModel().rows.map((row) => (
                <tr key={row.id} className="border-b border-line" data-testid="task-row">
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="px-3 py-2 whitespace-nowrap">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
          {rows.length === 0 && <p className="p-4 text-bark-soft">{list.data?.tasks.length ? 'No task matches these filters.' : 'No tasks here.'}</p>}
        </div>
      )}
    </div>
  );
}

const capitalised = (word: string) => word[0]!.toUpperCase() + word.slice(1);
