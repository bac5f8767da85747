'use client';

import { flexRender, type Table } from '@tanstack/react-table';
import { cn } from '@/lib/cn';

/**
 * The header of our TanStack tables: each sortable column is a big button with its direction shown
 * and announced (aria-sort). `stickyColumn` stays in view when a phone scrolls the table sideways;
 * columns with `meta: { numeric: true }` align right.
 */
export function SortableHead<T>({ table, stickyColumn }: { table: Table<T>; stickyColumn?: string }) {
  return (
    <thead>
      {table.getHeaderGroups().map((group) => (
        <tr key={group.id} className="border-b-2 border-line">
          {group.headers.map((header) => {
            const sorted = header.column.getIsSorted();
            const numeric = (header.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric;
            const label = flexRender(header.column.columnDef.header, header.getContext());
            return (
              <th
                key={header.id}
                scope="col"
                aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'}
                className={cn(numeric && 'text-right', header.column.id === stickyColumn && 'sticky left-0 bg-panel')}
              >
                {header.column.getCanSort() ? (
                  <button
                    type="button"
                    onClick={header.column.getToggleSortingHandler()}
                    className="inline-flex min-h-touch items-center gap-1 px-3 font-bold whitespace-nowrap"
                  >
                    {label}
                    <span aria-hidden="true">{sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}</span>
                  </button>
                ) : (
                  <span className="px-3">{label}</span>
                )}
              </th>
            );
          })}
        </tr>
      ))}
    </thead>
  );
}
