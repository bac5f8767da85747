/**
 * What a report may be asked for in its URL: the season, the season to compare with, and the
 * inputs of its estimates. Left out means "from the data, else the documented default". The API
 * answers 422 for a value it cannot read; the page drops such a value and keeps the rest.
 */
import { z } from 'zod';
import { GRAPE_TYPES } from '@/lib/viticulture';

const number = (message: string) => z.coerce.number(message).refine(Number.isFinite, message);
const year = z.coerce.number('Must be a year').int('Must be a year').min(1900, 'Must be a year from 1900').max(2200, 'Must be a year before 2200');

export const reportOptionsSchema = z.strictObject({
  season: year.optional(),
  // A year, or "none" for no comparison; left out compares with the season before.
  compare: z.union([z.literal('none'), year]).optional(),
  budsPerVine: number('Must be a number of buds').pipe(z.number().min(0, 'Cannot be negative').max(500, 'At most 500 buds')).optional(),
  budbreakPercent: number('Must be a percentage').pipe(z.number().min(0, 'Cannot be negative').max(100, 'At most 100%')).optional(),
  clustersPerShoot: number('Must be a number').pipe(z.number().min(0, 'Cannot be negative').max(10, 'At most 10 clusters a shoot')).optional(),
  clusterWeightG: number('Must be a weight in grams').pipe(z.number().min(0, 'Cannot be negative').max(3000, 'At most 3000 g')).optional(),
  clustersPerVine: number('Must be a number of clusters').pipe(z.number().min(0, 'Cannot be negative').max(2000, 'At most 2000 clusters a vine')).optional(),
  lagClusterWeightG: number('Must be a weight in grams').pipe(z.number().min(0, 'Cannot be negative').max(3000, 'At most 3000 g')).optional(),
  minutesPerVine: number('Must be a number of minutes').pipe(z.number().min(0, 'Cannot be negative').max(120, 'At most 120 minutes a vine')).optional(),
  hourlyCost: number('Must be an amount').pipe(z.number().min(0, 'Cannot be negative').max(100_000)).optional(),
  grapeType: z.enum(GRAPE_TYPES as [string, ...string[]], 'Must be one of the grape types of the balanced-pruning table').optional(),
  budTarget: number('Must be a number of buds').pipe(z.number().int('Must be a whole number').min(1, 'At least 1 bud').max(500, 'At most 500 buds')).optional(),
});

export type ReportOptions = z.infer<typeof reportOptionsSchema>;

export const REPORT_OPTION_KEYS = Object.keys(reportOptionsSchema.shape) as (keyof ReportOptions)[];

/** The inputs a person can change on the page without asking the server again. */
export const ESTIMATE_KEYS = [
  'budsPerVine',
  'budbreakPercent',
  'clustersPerShoot',
  'clusterWeightG',
  'clustersPerVine',
  'lagClusterWeightG',
  'minutesPerVine',
  'hourlyCost',
] as const;
export type EstimateKey = (typeof ESTIMATE_KEYS)[number];

export function searchToOptionsRaw(search: URLSearchParams): Record<string, string> {
  const raw: Record<string, string> = {};
  for (const [key, value] of search) if (value.trim() !== '') raw[key] = value.trim();
  return raw;
}

export const parseReportOptions = (search: URLSearchParams) => reportOptionsSchema.parse(searchToOptionsRaw(search));

/** For the page: an unreadable value (a hand-edited URL) is dropped, the rest kept; unknown keys are ignored. */
export function readReportOptions(search: URLSearchParams): ReportOptions {
  const raw: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(searchToOptionsRaw(search))) if ((REPORT_OPTION_KEYS as string[]).includes(key)) raw[key] = value;
  const first = reportOptionsSchema.safeParse(raw);
  if (first.success) return first.data;
  for (const issue of first.error.issues) delete raw[String(issue.path[0])];
  return reportOptionsSchema.safeParse(raw).data ?? {};
}

export function optionsToSearch(o: ReportOptions): URLSearchParams {
  const search = new URLSearchParams();
  for (const key of REPORT_OPTION_KEYS) {
    const value = o[key];
    if (value !== undefined) search.set(key, String(value));
  }
  return search;
}

/** The observation export: one block or all of them, one season. */
export const exportQuerySchema = z.strictObject({
  season: year,
  blockId: z.uuid('Must be the id of a block').optional(),
});
