'use client';

import { useInfiniteQuery } from '@tanstack/react-query';
import Link from 'next/link';
import { usePathname, useSearchParams } from 'next/navigation';
import { useEffect, useRef, useState } from 'react';
import { CellSwatch } from '@/components/grid/cell-swatch';
import { PhotoViewer, type ViewerPhoto } from '@/components/photos/photo-viewer';
import { Button } from '@/components/ui/button';
import { Input, Notice, Select } from '@/components/ui/field';
import { apiGet } from '@/lib/api-client';
import type { PhotoLogItem, PhotoLogResponse } from '@/lib/contracts/grid';
import { encodeCell } from '@/lib/grid/cells';
import { datesInOrder } from '@/lib/grid/filters';
import { formatDay, kindLabel, SEVERITY_LABELS, vineAddress } from '@/lib/grid/labels';
import { photoFiltersToSearch, readPhotoFilters, type PhotoFilters } from '@/lib/grid/photo-filters';
import { OBSERVATION_KINDS, type ObservationKind, type Severity } from '@/lib/viticulture';

interface PhotoLogProps {
  blocks: { id: string; name: string; rowCount: number }[];
  people: { id: string; name: string }[];
}

const PAGE = 30;

function viewerPhoto(p: PhotoLogItem): ViewerPhoto {
  const address = vineAddress(p.row, p.position);
  return {
    id: p.id,
    fullUrl: p.fullUrl,
    alt: `${kindLabel(p.observation.kind)}, ${p.block.name}, ${address}, ${formatDay(p.takenAt)}`,
    details: (
      <>
        <h2 className="text-xl font-bold">{kindLabel(p.observation.kind)}</h2>
        <p>
          {p.block.name}, {address}
        </p>
        <p className="flex items-center gap-2">
          <CellSwatch code={encodeCell('planted', p.observation.severity as Severity)} size={22} />
          {SEVERITY_LABELS[p.observation.severity as Severity]} · {p.observation.status}
        </p>
        {p.observation.summary && <p>{p.observation.summary}</p>}
        {p.observation.note && <p className="italic">“{p.observation.note}”</p>}
        <p className="text-sm text-bark-soft">
          Taken {formatDay(p.takenAt)}
          {p.recordedByName ? ` · recorded by ${p.recordedByName}` : ''}
        </p>
        <Link href={p.gridUrl} className="inline-flex min-h-touch items-center font-bold text-rootstock underline">
          Show this vine on the grid
        </Link>
      </>
    ),
  };
}

function describePhotoFilters(f: PhotoFilters, blocks: PhotoLogProps['blocks'], people: PhotoLogProps['people']) {
  const parts = [f.block ? (blocks.find((b) => b.id === f.block)?.name ?? 'one block') : 'All blocks'];
  if (f.row !== undefined) parts.push(`row ${f.row}`);
  parts.push(f.kind.length ? f.kind.map(kindLabel).join(', ') : 'every kind');
  if (f.severity !== undefined) parts.push(f.severity === 3 ? 'act now' : `${SEVERITY_LABELS[f.severity as Severity].toLowerCase()} or worse`);
  if (f.by) parts.push(`by ${people.find((p) => p.id === f.by)?.name ?? 'one person'}`);
  if (f.from) parts.push(`from ${formatDay(f.from)}`);
  if (f.to) parts.push(`to ${formatDay(f.to)}`);
  return parts.join(' · ');
}

/** Thumbnails across blocks, newest first, loaded a page at a time as the list scrolls; filters live in the URL. */
export function PhotoLog({ blocks, people }: PhotoLogProps) {
  const search = useSearchParams();
  const pathname = usePathname();
  const filters = readPhotoFilters(search);
  const filterKey = photoFiltersToSearch(filters).toString();
  const datesOk = datesInOrder(filters);
  const [open, setOpen] = useState<number | null>(null);
  const sentinel = useRef<HTMLDivElement>(null);

  const query = useInfiniteQuery({
    queryKey: ['photos', filterKey],
    queryFn: ({ pageParam, signal }) => {
      const params = new URLSearchParams(filterKey);
      params.set('limit', String(PAGE));
      if (pageParam) params.set('cursor', pageParam);
      return apiGet<PhotoLogResponse>(`/api/photos?${params}`, { signal });
    },
    initialPageParam: '',
    getNextPageParam: (last) => last.nextCursor ?? undefined,
    enabled: datesOk,
  });
  const photos = query.data?.pages.flatMap((p) => p.photos) ?? [];

  // Load the next page as the end of the list comes into view.
  useEffect(() => {
    const el = sentinel.current;
    if (!el) return;
    const observer = new IntersectionObserver(
      (entries) => {
        if (entries.some((e) => e.isIntersecting) && query.hasNextPage && !query.isFetchingNextPage) void query.fetchNextPage();
      },
      { rootMargin: '600px' },
    );
    observer.observe(el);
    return () => observer.disconnect();
  }, [query]);

  function set(patch: Partial<PhotoFilters>) {
    const next = { ...filters, ...patch };
    if (!next.block) next.row = undefined;
    const qs = photoFiltersToSearch(next).toString();
    window.history.replaceState(null, '', `${pathname}${qs ? `?${qs}` : ''}`);
  }

  const chosenBlock = blocks.find((b) => b.id === filters.block);

  return (
    <div className="flex flex-col gap-4">
      <header>
        <h1 className="text-3xl font-extrabold">Photo log</h1>
        <p className="mt-1">Photos from every block, newest first.</p>
      </header>

      <details className="group rounded-xl border-2 border-line bg-panel">
        <summary className="flex min-h-touch cursor-pointer items-center justify-between gap-2 px-4 py-2">
          <span>
            <span className="font-bold">Filters: </span>
            {describePhotoFilters(filters, blocks, people)}
          </span>
          <span aria-hidden="true" className="text-bark-soft group-open:rotate-180">
            ▾
          </span>
        </summary>
        <form className="grid grid-cols-2 gap-3 border-t-2 border-line p-4 md:grid-cols-4" onSubmit={(e) => e.preventDefault()} aria-label="Filter photos">
          <div className="flex flex-col gap-1">
            <label htmlFor="ph-block" className="font-bold">
              Block
            </label>
            <Select id="ph-block" value={filters.block ?? ''} onChange={(e) => set({ block: e.target.value || undefined })}>
              <option value="">All blocks</option>
              {blocks.map((b) => (
                <option key={b.id} value={b.id}>
                  {b.name}
                </option>
              ))}
            </Select>
          </div>
          <div className="flex flex-col gap-1">
            <label htmlFor="ph-row" className="font-bold">
              Row
            </label>
            <Input
              id="ph-row"
              type="number"
              inputMode="numeric"
              min={1}
              max={chosenBlock?.rowCount}
              disabled={!chosenBlock}
              placeholder={chosenBlock ? 'Any' : 'Pick a block'}
              value={filters.row ?? ''}
              onChange={(e) => set({ row: e.target.value ? Number(e.target.value) : undefined })}
            />
          </div>
          <div className="flex flex-col gap-1">
            <label htmlFor="ph-kind" className="font-bold">
              Kind
            </label>
            <Select id="ph-kind" value={filters.kind[0] ?? ''} onChange={(e) => set({ kind: e.target.value ? [e.target.value as ObservationKind] : [] })}>
              <option value="">Every kind</option>
              {OBSERVATION_KINDS.map((k) => (
                <option key={k} value={k}>
                  {kindLabel(k)}
                </option>
              ))}
            </Select>
          </div>
          <div className="flex flex-col gap-1">
            <label htmlFor="ph-severity" className="font-bold">
              Severity
            </label>
            <Select
              id="ph-severity"
              value={filters.severity ?? ''}
              onChange={(e) => set({ severity: e.target.value === '' ? undefined : Number(e.target.value) })}
            >
              <option value="">Any</option>
              <option value="1">Watch or worse</option>
              <option value="2">Act this season or sooner</option>
              <option value="3">Act now</option>
            </Select>
          </div>
          <div className="flex flex-col gap-1">
            <label htmlFor="ph-by" className="font-bold">
              Recorded by
            </label>
            <Select id="ph-by" value={filters.by ?? ''} onChange={(e) => set({ by: e.target.value || undefined })}>
              <option value="">Anyone</option>
              {people.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name}
                </option>
              ))}
            </Select>
          </div>
          <div className="flex flex-col gap-1">
            <label htmlFor="ph-from" className="font-bold">
              From
            </label>
            <Input id="ph-from" type="date" value={filters.from ?? ''} onChange={(e) => set({ from: e.target.value || undefined })} />
          </div>
          <div className="flex flex-col gap-1">
            <label htmlFor="ph-to" className="font-bold">
              To
            </label>
            <Input id="ph-to" type="date" value={filters.to ?? ''} aria-invalid={!datesOk} onChange={(e) => set({ to: e.target.value || undefined })} />
          </div>
          <div className="flex items-end">
            {filterKey && (
              <Button type="button" variant="quiet" onClick={() => window.history.replaceState(null, '', pathname)}>
                Clear filters
              </Button>
            )}
          </div>
          {!datesOk && (
            <p role="alert" className="col-span-full font-bold text-alarm">
              The end date is before the start date.
            </p>
          )}
        </form>
      </details>

      {query.isError && (
        <Notice tone="error">
          {query.error.message}{' '}
          <button type="button" className="font-bold underline" onClick={() => query.refetch()}>
            Try again
          </button>
        </Notice>
      )}
      {query.isPending && datesOk && <p role="status">Loading photos…</p>}
      {query.isSuccess && photos.length === 0 && <p className="rounded-xl border-2 border-line bg-panel p-4">No photos match these filters.</p>}

      <ul className="grid grid-cols-2 gap-2 sm:grid-cols-3 lg:grid-cols-5" aria-label="Photos" data-testid="photo-log">
        {photos.map((p, i) => (
          <li key={p.id}>
            <button
              type="button"
              className="flex w-full flex-col overflow-hidden rounded-xl border-2 border-line bg-panel text-left hover:border-rootstock"
              onClick={() => setOpen(i)}
            >
              <img
                src={p.thumbUrl}
                alt={`${kindLabel(p.observation.kind)}, ${p.block.name}, ${vineAddress(p.row, p.position)}`}
                width={320}
                height={p.width && p.height ? Math.round((320 * p.height) / p.width) : 240}
                loading="lazy"
                className="aspect-[4/3] h-auto w-full bg-ground object-cover"
              />
              <span className="flex items-center gap-2 p-2">
                <CellSwatch code={encodeCell('planted', p.observation.severity as Severity)} size={20} />
                <span className="min-w-0">
                  <span className="block truncate text-sm font-bold">{kindLabel(p.observation.kind)}</span>
                  <span className="block truncate text-xs text-bark-soft">
                    {p.block.name} · R{p.row} V{p.position} · {formatDay(p.takenAt)}
                  </span>
                </span>
              </span>
            </button>
          </li>
        ))}
      </ul>
      <div ref={sentinel} aria-hidden="true" />
      {query.hasNextPage && (
        <Button type="button" variant="secondary" onClick={() => query.fetchNextPage()} disabled={query.isFetchingNextPage}>
          {query.isFetchingNextPage ? 'Loading more photos…' : 'Load more photos'}
        </Button>
      )}
      {photos.length > 0 && !query.hasNextPage && <p className="text-center text-bark-soft">That is every photo that matches.</p>}

      <PhotoViewer
        photo={open !== null && photos[open] ? viewerPhoto(photos[open]) : null}
        onClose={() => setOpen(null)}
        onPrevious={open !== null && open > 0 ? () => setOpen(open - 1) : undefined}
        onNext={open !== null && open < photos.length - 1 ? () => setOpen(open + 1) : undefined}
      />
    </div>
  );
}
