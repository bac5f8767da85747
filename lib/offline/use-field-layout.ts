'use client';

import { useQuery } from '@tanstack/react-query';
import { apiGet } from '@/lib/api-client';
import type { FieldLayout } from '@/lib/contracts/field';

export type { FieldLayout };

/** The walkable layout of a block; served from the service worker's copy when there is no signal. */
export function useFieldLayout(blockId: string, initial?: FieldLayout) {
  return useQuery({
    queryKey: ['field-layout', blockId],
    queryFn: () => apiGet<FieldLayout>(`/api/field/blocks/${blockId}`),
    networkMode: 'always',
    staleTime: 60_000,
    // The walk page's own render of the layout, so the vine shows before any request.
    initialData: initial,
    initialDataUpdatedAt: initial ? Date.parse(initial.fetchedAt) : undefined,
  });
}

export const STATUS_BY_LETTER = { P: 'planted', M: 'missing', D: 'dead', R: 'replant' } as const;
