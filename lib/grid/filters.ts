/**
 * The grid's filters, one schema for the URL the page keeps them in and the route that applies
 * them in SQL. Dates are calendar days in UTC, both ends included.
 */
import { z } from 'zod';
import { OBSERVATION_KINDS, type ObservationKind } from '@/lib/viticulture';

export const FINDING_STATUSES = ['open', 'closed', 'all'] as const;
export type FindingStatus = (typeof FINDING_STATUSES)[number];

const day = z.iso.date('Must be a date as YYYY-MM-DD');

export const kindList = z
  .array(z.string())
  .superRefine((kinds, ctx) => {
    const unknown = kinds.filter((k) => !(OBSERVATION_KINDS as readonly string[]).includes(k));
    if (unknown.length) ctx.addIssue({ code: 'custom', message: `Unknown observation kind: ${unknown.join(', ')}` });
  })
  .transform((kinds) => [...new Set(kinds)].sort() as ObservationKind[]);

const gridFilterFields = z.strictObject({
  kind: kindList.default([]),
  from: day.optional(),
  to: day.optional(),
  by: z.uuid('Must be the id of a person').optional(),
  status: z.enum(FINDING_STATUSES, 'Must be open, closed or all').default('open'),
  flagged: z
    .enum(['0', '1'], 'Must be 0 or 1')
    .default('0')
    .transform((v) => v === '1'),
});

export const datesInOrder = (f: { from?: string; to?: string }) => !f.from || !f.to || f.from <= f.to;

export const gridFilterSchema = gridFilterFields.refine(datesInOrder, { message: 'Must be on or after the start date', path: ['to'] });

export type GridFilters = z.infer<typeof gridFilterSchema>;

export const DEFAULT_GRID_FILTERS: GridFilters = { kind: [], status: 'open', flagged: false };

/** Query-string values as the schema reads them: `kind` may repeat or be a comma list; empty means unset. */
export function searchToRaw(search: URLSearchParams, keys: readonly string[]) {
  const raw: Record<string, unknown> = {};
  for (const key of keys) {
    const values = search
      .getAll(key)
      .flatMap((v) => (key === 'kind' ? v.split(',') : [v]))
      .map((v) => v.trim())
      .filter(Boolean);
    if (values.length) raw[key] = key === 'kind' ? values : values[values.length - 1];
  }
  return raw;
}

export const GRID_FILTER_KEYS = ['kind', 'from', 'to', 'by', 'status', 'flagged'] as const;

export const parseGridFilters = (search: URLSearchParams) => gridFilterSchema.parse(searchToRaw(search, GRID_FILTER_KEYS));

/**
 * Lenient reading for the page: a value that cannot be read (a hand-edited URL) is dropped, the rest
 * kept. Dates out of order are kept too, so the form can show them with its message.
 */
export function readGridFilters(search: URLSearchParams): GridFilters {
  return readLeniently(gridFilterFields, searchToRaw(search, GRID_FILTER_KEYS)) ?? DEFAULT_GRID_FILTERS;
}

export function readLeniently<T>(schema: z.ZodType<T>, raw: Record<string, unknown>): T | undefined {
  const first = schema.safeParse(raw);
  if (first.success) return first.data;
  const kept = { ...raw };
  for (const issue of first.error.issues) delete kept[String(issue.path[0])];
  return schema.safeParse(kept).data;
}

/** The canonical query string: same filters, same string, so one cache entry per view. */
export function gridFiltersToSearch(f: GridFilters): URLSearchParams {
  const search = new URLSearchParams();
  if (f.kind.length) search.set('kind', [...f.kind].sort().join(','));
  if (f.from) search.set('from', f.from);
  if (f.to) search.set('to', f.to);
  if (f.by) search.set('by', f.by);
  if (f.status !== 'open') search.set('status', f.status);
  if (f.flagged) search.set('flagged', '1');
  return search;
}

/** The exclusive upper bound of a UTC calendar day. */
export function dayAfter(isoDay: string): string {
  const d = new Date(`${isoDay}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + 1);
  return d.toISOString();
}

const uuid = z.uuid();
/** Ids in URLs are checked before they reach SQL: a malformed one is simply not found. */
export const isUuid = (value: unknown): value is string => uuid.safeParse(value).success;
