'use client';

import { useQuery } from '@tanstack/react-query';
import { apiGet } from '@/lib/api-client';
import { LOCAL } from '@/lib/device-keys';
import type { MemberList, MemberView } from '@/lib/contracts/people';

export type CrewMember = Pick<MemberView, 'userId' | 'name' | 'email' | 'role'>;

const KEY = LOCAL.crew;

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
        const { members } = await apiGet<MemberList>('/api/members');
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
