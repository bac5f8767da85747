'use client';

import { useQuery, useQueryClient } from '@tanstack/react-query';
import { createStore, get, set } from 'idb-keyval';
import { useEffect, useState } from 'react';
import { collectionOf, listObservations, onOutboxChange } from '@/lib/offline/outbox';
import type { PhoneTaskList, TaskWithItems } from '@/lib/contracts/tasks';
import { apiGet } from '@/lib/api-client';
import { IDB } from '@/lib/device-keys';

/** The phone's copy of one task: the task view with its vines. */
export type PhoneTask = TaskWithItems;

type Kept = PhoneTaskList;

// The phone's copy of "my tasks", per person, so the list and the task walk open with no signal.
const tasksStore = () => createStore(...IDB.tasks);

/** Open tasks assigned to the signed-in person: from the server when it answers, else this phone's last copy. */
export function useMyTasks(owner: string, enabled = true) {
  return useQuery({
    queryKey: ['my-tasks', owner],
    enabled,
    networkMode: 'always',
    staleTime: 30_000,
    queryFn: async (): Promise<Kept & { offline: boolean }> => {
      try {
        const body = await apiGet<Kept>('/api/tasks?assignee=me&items=1');
        await set(owner, { tasks: body.tasks, fetchedAt: body.fetchedAt }, tasksStore());
        // Keep each task's block layout too, so its walk opens offline (the service worker caches it).
        for (const blockId of new Set(body.tasks.map((t) => t.blockId))) void apiGet(`/api/field/blocks/${blockId}`).catch(() => undefined);
        return { ...body, offline: false };
      } catch (err) {
        const kept = await get<Kept>(owner, tasksStore());
        if (kept) return { ...kept, offline: true };
        throw err;
      }
    },
  });
}

export const addressKey = (row: number, position: number) => `${row}:${position}`;

/**
 * Vines of a task marked done on this phone and not yet acknowledged by the server. When one is
 * acknowledged the server's copy of the task is fetched again, so the vine stays done on screen.
 */
export function useQueuedDone(taskId: string | undefined) {
  const queryClient = useQueryClient();
  const [done, setDone] = useState<Set<string>>(new Set());
  useEffect(() => {
    if (!taskId) return;
    let previous = new Set<string>();
    const load = () =>
      void listObservations().then((all) => {
        const now = new Set(
          all
            .filter((e) => collectionOf(e) === 'task-updates' && e.record.taskId === taskId && e.state !== 'rejected')
            .map((e) => addressKey(e.record.row, e.record.position)),
        );
        if ([...previous].some((k) => !now.has(k))) void queryClient.invalidateQueries({ queryKey: ['my-tasks'] });
        previous = now;
        setDone(now);
      });
    load();
    return onOutboxChange(load);
  }, [taskId, queryClient]);
  return done;
}

/** Marks a vine done in the phone's copy at once, so it stays done after its update is sent. */
export async function markDoneInCopy(owner: string, taskId: string, row: number, position: number) {
  const kept = await get<Kept>(owner, tasksStore());
  if (!kept) return;
  const tasks = kept.tasks.map((t) =>
    t.id !== taskId
      ? t
      : {
          ...t,
          items: t.items.map((i) => (i.row === row && i.position === position && i.status === 'open' ? { ...i, status: 'done' as const } : i)),
          vinesDone: t.items.filter((i) => i.status === 'done' || (i.row === row && i.position === position)).length,
        },
  );
  await set(owner, { ...kept, tasks }, tasksStore());
}
