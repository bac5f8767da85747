'use client';

import { useQuery } from '@tanstack/react-query';

export interface FieldLayout {
  block: {
    id: string;
    name: string;
    variety: string;
    trainingSystem: 'cane' | 'spur' | 'other';
    vinesPerPanel: number | null;
    rowCount: number;
    positionOrigin: string | null;
    unitSystem: 'metric' | 'imperial';
  };
  rows: { row: number; vineCount: number; statuses: string }[];
  /** [row, position, worst open severity, open findings] */
  findings: [number, number, number, number][];
  sprays: { id: string; product: string; appliedAt: string; reiHours: number; reentryAt: string }[];
  plans: { id: string; name: string; addresses: { row: number; position: number }[] }[];
  fetchedAt: string;
}

/** The walkable layout of a block; served from the service worker's copy when there is no signal. */
export function useFieldLayout(blockId: string, initial?: FieldLayout) {
  return useQuery({
    queryKey: ['field-layout', blockId],
    queryFn: async () => {
      const res = await fetch(`/api/field/blocks/${blockId}`);
      if (!res.ok) throw new Error(String(res.status));
      return (await res.json()) as FieldLayout;
    },
    networkMode: 'always',
    staleTime: 60_000,
    // The walk page's own render of the layout, so the vine shows before any request.
    initialData: initial,
    initialDataUpdatedAt: initial ? Date.parse(initial.fetchedAt) : undefined,
  });
}

export const STATUS_BY_LETTER = { P: 'planted', M: 'missing', D: 'dead', R: 'replant' } as const;
