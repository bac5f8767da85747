/**
 * The photo log's filters and its cursor, shared by the page (URL state) and GET /api/photos.
 * Photos are ordered newest first by when they were taken (upload time when the camera gave none).
 */
import { z } from 'zod';
import { datesInOrder, kindList, readLeniently, searchToRaw } from '@/lib/grid/filters';

const day = z.iso.date('Must be a date as YYYY-MM-DD');

export const PHOTO_PAGE_MAX = 60;
export const PHOTO_PAGE_DEFAULT = 30;

const photoFilterFields = z.strictObject({
  block: z.uuid('Must be the id of a block').optional(),
  row: z.coerce.number('Must be a row number').int('Must be a whole number').min(1, 'Rows start at 1').max(10000).optional(),
  kind: kindList.default([]),
  severity: z.coerce.number('Must be 0 to 3').int().min(0, 'Must be 0 to 3').max(3, 'Must be 0 to 3').optional(),
  by: z.uuid('Must be the id of a person').optional(),
  from: day.optional(),
  to: day.optional(),
});

export const photoFilterSchema = photoFilterFields
  .refine(datesInOrder, { message: 'Must be on or after the start date', path: ['to'] })
  .refine((f) => f.row === undefined || f.block !== undefined, { message: 'Choose a block to filter by row', path: ['row'] });

export type PhotoFilters = z.infer<typeof photoFilterSchema>;

export const PHOTO_FILTER_KEYS = ['block', 'row', 'kind', 'severity', 'by', 'from', 'to'] as const;

export const photoPageSchema = z.strictObject({
  cursor: z.string().max(200).optional(),
  limit: z.coerce.number('Must be a number').int().min(1, 'At least 1').max(PHOTO_PAGE_MAX, `At most ${PHOTO_PAGE_MAX}`).default(PHOTO_PAGE_DEFAULT),
});

export const parsePhotoFilters = (search: URLSearchParams) => photoFilterSchema.parse(searchToRaw(search, PHOTO_FILTER_KEYS));
export const parsePhotoPage = (search: URLSearchParams) => photoPageSchema.parse(searchToRaw(search, ['cursor', 'limit']));

/** Lenient, as readGridFilters; a row without a block means nothing and is dropped. */
export function readPhotoFilters(search: URLSearchParams): PhotoFilters {
  const read = readLeniently(photoFilterFields, searchToRaw(search, PHOTO_FILTER_KEYS)) ?? { kind: [] };
  return read.block ? read : { ...read, row: undefined };
}

export function photoFiltersToSearch(f: PhotoFilters): URLSearchParams {
  const search = new URLSearchParams();
  if (f.block) search.set('block', f.block);
  if (f.block && f.row !== undefined) search.set('row', String(f.row));
  if (f.kind.length) search.set('kind', [...f.kind].sort().join(','));
  if (f.severity !== undefined) search.set('severity', String(f.severity));
  if (f.by) search.set('by', f.by);
  if (f.from) search.set('from', f.from);
  if (f.to) search.set('to', f.to);
  return search;
}

/** Where the next page starts: the last photo's time and id, opaque to the client. */
export interface PhotoCursor {
  at: string;
  id: string;
}

export function encodeCursor(c: PhotoCursor): string {
  return btoa(`${c.at}|${c.id}`).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

const cursorShape = z.tuple([z.iso.datetime({ offset: true }), z.uuid()]);

export function decodeCursor(value: string): PhotoCursor | null {
  try {
    const text = atob(value.replace(/-/g, '+').replace(/_/g, '/'));
    const parsed = cursorShape.safeParse(text.split('|'));
    return parsed.success ? { at: parsed.data[0], id: parsed.data[1] } : null;
  } catch {
    return null;
  }
}
