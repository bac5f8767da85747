'use client';

import { Button } from '@/components/ui/button';
import { Input, Select } from '@/components/ui/field';
import { cn } from '@/lib/cn';
import { DEFAULT_GRID_FILTERS, FINDING_STATUSES, type GridFilters as Filters } from '@/lib/grid/filters';
import { formatDay, kindLabel } from '@/lib/grid/labels';
import { OBSERVATION_KINDS, type ObservationKind } from '@/lib/viticulture';

export interface Person {
  id: string;
  name: string;
}

interface GridFiltersProps {
  filters: Filters;
  people: Person[];
  onChange: (next: Filters) => void;
}

const STATUS_LABELS = { open: 'Open', closed: 'Closed', all: 'All' } as const;

const chip =
  'flex min-h-touch cursor-pointer items-center gap-2 rounded-lg border-2 px-3 font-bold has-[:checked]:border-rootstock has-[:checked]:bg-rootstock-tint has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-cut';

export function activeFilterCount(f: Filters) {
  return (f.kind.length ? 1 : 0) + (f.from ? 1 : 0) + (f.to ? 1 : 0) + (f.by ? 1 : 0) + (f.status !== 'open' ? 1 : 0) + (f.flagged ? 1 : 0);
}

/** "Trunk injury · open findings · from 1 Mar 2026 · by Teo": what the grid shows, in one line. */
export function describeFilters(f: Filters, people: Person[]) {
  const parts = [f.kind.length ? f.kind.map(kindLabel).join(', ') : 'Every kind', f.status === 'all' ? 'open and closed findings' : `${f.status} findings`];
  if (f.from) parts.push(`from ${formatDay(f.from)}`);
  if (f.to) parts.push(`to ${formatDay(f.to)}`);
  if (f.by) parts.push(`by ${people.find((p) => p.id === f.by)?.name ?? 'one person'}`);
  if (f.flagged) parts.push('flagged vines only');
  return parts.join(' · ');
}

/** Every change applies at once and goes into the URL, so a filtered view can be shared. */
export function GridFilters({ filters, people, onChange }: GridFiltersProps) {
  const set = (patch: Partial<Filters>) => onChange({ ...filters, ...patch });
  const toggleKind = (kind: ObservationKind, on: boolean) => set({ kind: on ? [...filters.kind, kind].sort() : filters.kind.filter((k) => k !== kind) });
  const count = activeFilterCount(filters);
  const badDates = Boolean(filters.from && filters.to && filters.from > filters.to);

  return (
    <details className="group rounded-xl border-2 border-line bg-panel">
      <summary className="flex min-h-touch cursor-pointer items-center justify-between gap-2 px-4 py-2">
        <span>
          <span className="font-bold">Filters{count ? ` (${count} on)` : ''}: </span>
          <span data-testid="grid-filter-summary">{describeFilters(filters, people)}</span>
        </span>
        <span aria-hidden="true" className="text-bark-soft group-open:rotate-180">
          ▾
        </span>
      </summary>
      <div className="flex flex-col gap-4 border-t-2 border-line p-4">
        <fieldset>
          <legend className="mb-2 font-bold">Kinds of finding</legend>
          <div className="flex flex-wrap gap-2">
            {OBSERVATION_KINDS.map((kind) => (
              <label key={kind} className={cn(chip, 'border-line')}>
                <input
                  type="checkbox"
                  className="size-5 accent-rootstock"
                  checked={filters.kind.includes(kind)}
                  onChange={(e) => toggleKind(kind, e.target.checked)}
                />
                {kindLabel(kind)}
              </label>
            ))}
          </div>
          <p className="mt-1 text-sm text-bark-soft">None ticked means every kind.</p>
        </fieldset>

        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <fieldset>
            <legend className="mb-2 font-bold">Findings</legend>
            <div className="flex gap-2">
              {FINDING_STATUSES.map((status) => (
                <label key={status} className={cn(chip, 'flex-1 justify-center border-line')}>
                  <input type="radio" name="grid-status" className="sr-only" checked={filters.status === status} onChange={() => set({ status })} />
                  {STATUS_LABELS[status]}
                </label>
              ))}
            </div>
          </fieldset>
          <div className="flex flex-col gap-1">
            <label htmlFor="grid-by" className="font-bold">
              Recorded by
            </label>
            <Select id="grid-by" value={filters.by ?? ''} onChange={(e) => set({ by: e.target.value || undefined })}>
              <option value="">Anyone</option>
              {people.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name}
                </option>
              ))}
            </Select>
          </div>
          <div className="flex flex-col gap-1">
            <label htmlFor="grid-from" className="font-bold">
              From
            </label>
            <Input id="grid-from" type="date" value={filters.from ?? ''} max={filters.to} onChange={(e) => set({ from: e.target.value || undefined })} />
          </div>
          <div className="flex flex-col gap-1">
            <label htmlFor="grid-to" className="font-bold">
              To
            </label>
            <Input
              id="grid-to"
              type="date"
              value={filters.to ?? ''}
              min={filters.from}
              aria-invalid={badDates}
              aria-describedby={badDates ? 'grid-dates-error' : undefined}
              onChange={(e) => set({ to: e.target.value || undefined })}
            />
            {badDates && (
              <p id="grid-dates-error" role="alert" className="text-sm font-bold text-alarm">
                The end date is before the start date.
              </p>
            )}
          </div>
        </div>

        <div className="flex flex-wrap items-center gap-3">
          <label className={cn(chip, 'border-line')}>
            <input type="checkbox" className="size-5 accent-rootstock" checked={filters.flagged} onChange={(e) => set({ flagged: e.target.checked })} />
            Flagged vines only
          </label>
          {count > 0 && (
            <Button type="button" variant="quiet" onClick={() => onChange(DEFAULT_GRID_FILTERS)}>
              Clear filters
            </Button>
          )}
        </div>
      </div>
    </details>
  );
}
