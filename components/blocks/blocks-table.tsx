'use client';

import { useQuery } from '@tanstack/react-query';
import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type FilterFn,
  type SortingState,
} from '@tanstack/react-table';
import Link from 'next/link';
import { useMemo, useState } from 'react';
import { Field, FilterSelect, Input, Notice } from '@/components/ui/field';
import { SortableHead } from '@/components/ui/sortable-head';
import { cn } from '@/lib/cn';
import type { BlockList, BlockView } from '@/lib/contracts/blocks';
import { formatAreaM2, formatCount, formatLengthM, type UnitSystem } from '@/lib/units';
import { TRAINING_SYSTEMS } from '@/lib/validation/block';
import { apiGet } from '@/lib/api-client';

const TRAINING_LABEL = { cane: 'Cane', spur: 'Spur', other: 'Other' } as const;

const matches: FilterFn<BlockView> = (row, _column, query: string) => {
  const b = row.original;
  const text = [b.name, b.variety, b.clone, b.rootstock, b.plantingYear].filter(Boolean).join(' ').toLowerCase();
  return query
    .toLowerCase()
    .split(/\s+/)
    .every((word) => text.includes(word));
};

function columnsFor(units: UnitSystem): ColumnDef<BlockView>[] {
  const number = (value: number) => formatCount(value);
  return [
    {
      accessorKey: 'name',
      header: 'Block',
      cell: ({ row }) => (
        <Link href={`/blocks/${row.original.id}`} className="font-bold text-rootstock underline">
          {row.original.name}
          {row.original.archivedAt && <span className="ml-2 text-sm font-normal text-bark-soft">(archived)</span>}
        </Link>
      ),
    },
    { accessorKey: 'variety', header: 'Variety' },
    {
      accessorKey: 'trainingSystem',
      header: 'Training',
      cell: ({ getValue }) => TRAINING_LABEL[getValue<BlockView['trainingSystem']>()],
      filterFn: 'equalsString',
    },
    { accessorKey: 'rowCount', header: 'Rows', cell: ({ getValue }) => number(getValue<number>()), meta: { numeric: true } },
    { accessorKey: 'vineCount', header: 'Vines', cell: ({ getValue }) => number(getValue<number>()), meta: { numeric: true } },
    { id: 'missing', accessorFn: (b) => b.counts.missing + b.counts.dead, header: 'Missing or dead', meta: { numeric: true } },
    { id: 'replant', accessorFn: (b) => b.counts.replant, header: 'Replants', meta: { numeric: true } },
    {
      id: 'spacing',
      accessorFn: (b) => b.rowSpacingM * b.vineSpacingM,
      header: 'Spacing (row × vine)',
      cell: ({ row }) => `${formatLengthM(row.original.rowSpacingM, units)} × ${formatLengthM(row.original.vineSpacingM, units)}`,
    },
    { accessorKey: 'areaM2', header: 'Area', cell: ({ getValue }) => formatAreaM2(getValue<number>(), units), meta: { numeric: true } },
    { accessorKey: 'plantingYear', header: 'Planted', sortUndefined: 'last', meta: { numeric: true } },
  ];
}

export function BlocksTable({ units }: { units: UnitSystem }) {
  const [archived, setArchived] = useState(false);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'name', desc: false }]);
  const [query, setQuery] = useState('');
  const [training, setTraining] = useState('');
  const list = useQuery({
    queryKey: ['blocks', { archived }],
    queryFn: () => apiGet<BlockList>(`/api/blocks${archived ? '?archived=1' : ''}`),
  });
  const columns = useMemo(() => columnsFor(units), [units]);
  const columnFilters = useMemo(() => (training ? [{ id: 'trainingSystem', value: training }] : []), [training]);
  const table = useReactTable({
    data: list.data?.blocks ?? [],
    columns,
    state: { sorting, globalFilter: query, columnFilters },
    onSortingChange: setSorting,
    globalFilterFn: matches,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });
  const rows = table.getRowModel().rows;

  return (
    <div className="flex flex-col gap-4">
      <div className="grid gap-3 sm:grid-cols-[1fr_12rem_auto] sm:items-end">
        <Field id="block-search" label="Find a block">
          <Input id="block-search" type="search" value={query} onChange={(e) => setQuery(e.target.value)} placeholder="Name, variety, clone…" />
        </Field>
        <FilterSelect
          id="block-training"
          label="Training"
          value={training}
          onChange={setTraining}
          any="All"
          options={TRAINING_SYSTEMS.map((t) => [t, TRAINING_LABEL[t]] as const)}
        />
        <label className="flex min-h-touch items-center gap-2 font-bold">
          <input type="checkbox" className="size-6" checked={archived} onChange={(e) => setArchived(e.target.checked)} />
          Show archived
        </label>
      </div>
      {list.isError && <Notice tone="error">{list.error.message}</Notice>}
      {list.isPending ? (
        <p aria-busy="true">Loading blocks…</p>
      ) : (
        <div className="overflow-x-auto rounded-lg border-2 border-line bg-panel" role="region" aria-label="Blocks" tabIndex={0}>
          <table className="w-full border-collapse text-left">
            <SortableHead table={table} stickyColumn="name" />
            <tbody>
              {rows.map((row) => (
                <tr key={row.id} className="border-b border-line">
                  {row.getVisibleCells().map((cell) => {
                    const numeric = (cell.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric;
                    return (
                      <td
                        key={cell.id}
                        className={cn(
                          'px-3 py-2 whitespace-nowrap',
                          numeric && 'text-right tabular-nums',
                          cell.column.id === 'name' && 'sticky left-0 bg-panel',
                        )}
                      >
                        {flexRender(cell.column.columnDef.cell, cell.getContext())}
                      </td>
                    );
                  })}
                </tr>
              ))}
            </tbody>
          </table>
          {rows.length === 0 && <p className="p-4 text-bark-soft">{list.data?.blocks.length ? 'No block matches these filters.' : 'No blocks yet.'}</p>}
        </div>
      )}
    </div>
  );
}
