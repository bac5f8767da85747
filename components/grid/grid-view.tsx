'use client';

import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { usePathname, useSearchParams } from 'next/navigation';
import { useEffect, useMemo, useState } from 'react';
import { GridCanvas, type CellRef } from '@/components/grid/grid-canvas';
import { GridFilters, type Person } from '@/components/grid/grid-filters';
import { GridLegend } from '@/components/grid/grid-legend';
import { GridSummary } from '@/components/grid/grid-summary';
import { VinePanel } from '@/components/grid/vine-panel';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/field';
import { apiGet } from '@/lib/api-client';
import type { GridResponse } from '@/lib/contracts/grid';
import { cellLevel, unpackRow } from '@/lib/grid/cells';
import { describeRow, nextProblem } from '@/lib/grid/describe';
import { datesInOrder, gridFiltersToSearch, readGridFilters, type GridFilters as Filters } from '@/lib/grid/filters';
import { SEVERITY_LABELS } from '@/lib/grid/labels';
import type { Severity } from '@/lib/viticulture';

interface GridViewProps {
  block: { id: string; name: string; variety: string; positionOrigin: string | null; rowCount: number; vinesPerRow: number };
  people: Person[];
}

const CELL_SIZES = [12, 16, 22, 30, 40];
const DEFAULT_SIZE = 2;

async function fetchGrid(blockId: string, search: string, signal: AbortSignal) {
  const data = await apiGet<GridResponse>(`/api/grid/${blockId}${search ? `?${search}` : ''}`, { signal });
  performance.mark('vw-grid-data');
  return data;
}

function readAddress(search: URLSearchParams) {
  const row = Number(search.get('row'));
  const position = Number(search.get('position'));
  return Number.isInteger(row) && row > 0 && Number.isInteger(position) && position > 0 ? { row, position } : null;
}

/**
 * The row grid page: filters, the grid with its legend, the summary and the vine panel. Filters and
 * the open vine live in the URL (replaced in place, without a server round trip), and each filter
 * combination is its own cached query.
 */
export function GridView({ block, people }: GridViewProps) {
  const search = useSearchParams();
  const pathname = usePathname();
  const fromUrl = readGridFilters(search);
  const urlKey = gridFiltersToSearch(fromUrl).toString();
  // Next applies a replaced URL to useSearchParams in a transition, a moment later; until then the
  // controls show what was just chosen, so a tapped box stays ticked on a slow phone.
  const [chosen, setChosen] = useState<Filters | null>(null);
  useEffect(() => setChosen(null), [urlKey]);
  const filters = chosen ?? fromUrl;
  const filterKey = gridFiltersToSearch(filters).toString();
  const datesOk = datesInOrder(filters);
  const address = readAddress(search);
  const [size, setSize] = useState(DEFAULT_SIZE);
  const [activeAt, setActiveAt] = useState<CellRef>({ r: 0, c: 0 });

  const query = useQuery({
    queryKey: ['grid', block.id, filterKey],
    queryFn: ({ signal }) => fetchGrid(block.id, filterKey, signal),
    placeholderData: keepPreviousData,
    enabled: datesOk,
  });
  const data = query.data;
  const rows = useMemo(() => data?.rows ?? [], [data]);
  const cells = useMemo(() => data?.cells.map(unpackRow) ?? [], [data]);
  const rowIndex = useMemo(() => new Map(rows.map((n, i) => [n, i])), [rows]);

  const selected = address && rowIndex.has(address.row) ? { r: rowIndex.get(address.row)!, c: address.position - 1 } : null;
  const active = activeAt.r < rows.length ? activeAt : { r: 0, c: 0 };

  // A shared link with a vine in it opens with that vine active.
  const addressKey = address ? `${address.row}:${address.position}` : '';
  useEffect(() => {
    if (selected) setActiveAt(selected);
    // Only when the address in the URL or the rows change, not on every render.
  }, [addressKey, rows]);

  function writeUrl(nextFilters: Filters, vine: { row: number; position: number } | null) {
    const params = gridFiltersToSearch(nextFilters);
    if (vine) {
      params.set('row', String(vine.row));
      params.set('position', String(vine.position));
    }
    const qs = params.toString();
    window.history.replaceState(null, '', `${pathname}${qs ? `?${qs}` : ''}`);
  }

  const select = (cell: CellRef | null) => writeUrl(filters, cell ? { row: rows[cell.r]!, position: cell.c + 1 } : null);

  const worstLevel = useMemo(() => {
    let worst = -1;
    for (const codes of cells) for (const code of codes) worst = Math.max(worst, cellLevel(code) ?? -1);
    return worst;
  }, [cells]);

  function goToProblem(step: 1 | -1) {
    const next = nextProblem(cells, active, Math.max(1, worstLevel), step);
    if (!next) return;
    setActiveAt(next);
    select(next);
  }

  function goToRow(row: number) {
    const r = rowIndex.get(row);
    if (r === undefined) return;
    const codes = cells[r]!;
    let best = 0;
    codes.forEach((code, c) => {
      if ((cellLevel(code) ?? -1) > (cellLevel(codes[best]!) ?? -1)) best = c;
    });
    setActiveAt({ r, c: best });
    select({ r, c: best });
  }

  return (
    <div className="flex flex-col gap-4">
      <header>
        <p className="text-bark-soft">
          {block.variety} · {block.rowCount} rows × {block.vinesPerRow} vines
        </p>
        <h1 className="text-3xl font-extrabold">{block.name}: row grid</h1>
        {block.positionOrigin && <p className="mt-1">Vine numbers run from the left: {block.positionOrigin.replace(/^Vine 1 /, 'vine 1 ')}.</p>}
      </header>

      <GridFilters
        filters={filters}
        people={people}
        onChange={(next) => {
          setChosen(next);
          writeUrl(next, address);
        }}
      />

      {query.isError && (
        <Notice tone="error">
          {query.error.message}{' '}
          <button type="button" className="font-bold underline" onClick={() => query.refetch()}>
            Try again
          </button>
        </Notice>
      )}

      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_24rem]">
        <section aria-label="Row grid" className="flex min-w-0 flex-col gap-3">
          <div className="flex flex-wrap items-center gap-2">
            <Button
              type="button"
              variant="secondary"
              onClick={() => goToProblem(-1)}
              disabled={worstLevel < 1}
              aria-label="Previous vine with the worst finding"
            >
              ←
            </Button>
            <Button type="button" onClick={() => goToProblem(1)} disabled={worstLevel < 1} data-testid="next-worst">
              Next {worstLevel >= 1 ? SEVERITY_LABELS[worstLevel as Severity].toLowerCase() : 'problem'} vine
            </Button>
            <div className="ml-auto flex items-center gap-1" role="group" aria-label="Cell size">
              <Button type="button" variant="secondary" onClick={() => setSize((s) => Math.max(0, s - 1))} disabled={size === 0} aria-label="Smaller cells">
                −
              </Button>
              <Button
                type="button"
                variant="secondary"
                onClick={() => setSize((s) => Math.min(CELL_SIZES.length - 1, s + 1))}
                disabled={size === CELL_SIZES.length - 1}
                aria-label="Larger cells"
              >
                +
              </Button>
            </div>
          </div>
          {query.isPending && datesOk ? (
            <p role="status" className="rounded-xl border-2 border-line bg-panel p-6">
              Loading the grid…
            </p>
          ) : (
            <div aria-busy={query.isFetching} className={query.isPlaceholderData ? 'opacity-60 transition-opacity' : ''}>
              <GridCanvas
                rows={rows}
                cells={cells}
                cellSize={CELL_SIZES[size]!}
                active={active}
                selected={selected}
                vinesPerPanel={data?.block.vinesPerPanel ?? null}
                label={`Row grid of ${block.name}: ${rows.length} rows, vines numbered from the left`}
                onActiveChange={setActiveAt}
                onSelect={select}
              />
            </div>
          )}
          <GridLegend />
          <details className="rounded-xl border-2 border-line bg-panel">
            <summary className="flex min-h-touch cursor-pointer items-center px-4 font-bold">Rows as a list (for screen readers and print)</summary>
            <ol className="flex flex-col gap-1 border-t-2 border-line p-4">
              {rows.map((row, r) => (
                <li key={row}>
                  <button type="button" className="min-h-touch w-full text-left hover:underline" onClick={() => goToRow(row)}>
                    {describeRow(row, cells[r]!)}
                  </button>
                </li>
              ))}
            </ol>
          </details>
        </section>

        <aside className="flex flex-col gap-4">
          {address && (
            <div className="fixed inset-x-0 bottom-0 z-20 max-h-[60dvh] overflow-y-auto rounded-t-2xl border-t-2 border-line bg-panel p-4 shadow-[0_-8px_24px_rgba(0,0,0,0.25)] lg:static lg:max-h-none lg:rounded-2xl lg:border-2 lg:shadow-none">
              <VinePanel blockId={block.id} row={address.row} position={address.position} onClose={() => select(null)} />
            </div>
          )}
          {data && <GridSummary summary={data.summary} onGoToRow={goToRow} />}
        </aside>
      </div>
    </div>
  );
}
