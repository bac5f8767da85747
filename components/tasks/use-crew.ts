'use client';

import { useQuery } from '@tanstack/react-query';

export interface CrewMember {
  userId: string;
  name: string | null;
  email: string;
  role: 'manager' | 'scout' | 'pruner' | 'advisor';
}

const KEY = 'vineward-crew';

/**
 * The organisation's members, for choosing a pruner or mentioning someone. The last list fetched is
 * kept on the phone, so a pruning check can still name the pruner with no signal.
 */
export function useCrew() {
  return useQuery({
    queryKey: ['crew'],
    networkMode: 'always',
    staleTime: 5 * 60_000,
    queryFn: async (): Promise<CrewMember[]> => {
      try {
        const res = await fetch('/api/members');
        if (!res.ok) throw new Error(String(res.status));
        const { members } = (await res.json()) as { members: CrewMember[] };
        localStorage.setItem(KEY, JSON.stringify(members));
        return members;
      } catch (err) {
        const kept = localStorage.getItem(KEY);
        if (kept) return JSON.parse(kept) as CrewMember[];
        throw err;
      }
    },
  });
}

export const memberLabel = (m: { name: string | null; email: string }) => m.name ?? m.email;
