/** What the grid, vine and photo-log routes answer, for the pages that read them, and one fetch helper. */
import type { Slot } from '@/lib/grid/cells';
import type { GridFilters } from '@/lib/grid/filters';
import type { GridSummary } from '@/lib/grid/summary';
import type { VinePlanReading } from '@/lib/grid/vine-plan';

export interface GridResponse {
  block: {
    id: string;
    name: string;
    variety: string;
    trainingSystem: string;
    rowCount: number;
    vinesPerRow: number;
    vinesPerPanel: number | null;
    rowOrder: 'ascending' | 'descending';
    positionOrigin: string | null;
  };
  filters: GridFilters;
  rows: number[];
  cells: number[][];
  summary: GridSummary;
}

export interface VinePhoto {
  id: string;
  width: number | null;
  height: number | null;
  takenAt: string;
}

export interface VineObservation {
  id: string;
  kind: string;
  data: Record<string, unknown>;
  note: string;
  observedAt: string;
  severity: number;
  status: 'open' | 'closed';
  closedAt: string | null;
  recordedBy: string | null;
  recordedByName: string | null;
  summary: string;
  photos: VinePhoto[];
}

export interface VinePanelResponse {
  vine: {
    positionId: string;
    blockId: string;
    blockName: string;
    trainingSystem: string;
    vinesPerPanel: number | null;
    positionOrigin: string | null;
    row: number;
    position: number;
    status: Exclude<Slot, 'none'>;
    replantYear: number | null;
  };
  plantings: { plantingYear: number | null; clone: string | null; rootstock: string | null; removedYear: number | null; removalReason: string | null }[];
  observations: VineObservation[];
  plan: VinePlanReading;
  flags: { id: string; text: string; by: string | null; at: string }[];
  comments: { id: string; text: string; by: string | null; at: string }[];
  units: 'metric' | 'imperial';
  walkUrl: string;
  gridUrl: string;
}

export interface PhotoLogItem {
  id: string;
  thumbUrl: string;
  fullUrl: string;
  width: number | null;
  height: number | null;
  takenAt: string;
  observation: { id: string; kind: string; severity: number; status: 'open' | 'closed'; note: string; observedAt: string; summary: string };
  block: { id: string; name: string };
  row: number;
  position: number;
  positionId: string;
  recordedByName: string | null;
  gridUrl: string;
}

export interface PhotoLogResponse {
  photos: PhotoLogItem[];
  nextCursor: string | null;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly fields?: Record<string, string[]>,
  ) {
    super(message);
  }
}

/** GETs JSON from our own API; a non-2xx answer becomes an ApiError carrying the server's message. */
export async function getJson<T>(url: string, signal?: AbortSignal): Promise<T> {
  const res = await fetch(url, { signal, headers: { accept: 'application/json' } });
  if (!res.ok) {
    const body = (await res.json().catch(() => null)) as { error?: { message?: string; fields?: Record<string, string[]> } } | null;
    throw new ApiError(res.status, body?.error?.message ?? `The server answered ${res.status}.`, body?.error?.fields);
  }
  return (await res.json()) as T;
}
