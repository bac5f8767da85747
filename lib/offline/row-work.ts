'use client';
/**
 * Row work on the phone: records go through the outbox as the "row-work" collection (see
 * COLLECTIONS in lib/offline/sync.ts), and the rows already done in each pass come from the server's
 * last answer (kept by the service worker) merged with what still waits on this phone, so a row
 * marked done shows as done at once, with or without signal.
 */
import { useQuery } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { LOCAL } from '@/lib/device-keys';
import { enqueueRecord, listObservations, onOutboxChange, type RecordEntry } from '@/lib/offline/outbox';
import type { RowWorkPass } from '@/lib/work/passes';
import { apiGet } from '@/lib/api-client';
import type { DoneRows } from '@/lib/contracts/field';

export const ROW_WORK_COLLECTION = 'row-work';

export interface RowWorkDraft {
  id: string;
  blockId: string;
  row: number;
  pass: RowWorkPass;
  fromPosition?: number;
  toPosition?: number;
  crewSize: number;
  personHours: number;
  startedAt?: string;
  finishedAt: string;
  note: string;
}

export function enqueueRowWork(owner: string, record: RowWorkDraft) {
  // The outbox's record type names a vine; row work names a row (and maybe a run), which the list shows by row.
  return enqueueRecord(owner, ROW_WORK_COLLECTION, record as unknown as RecordEntry['record']);
}

/** What a crew lead entered last, offered again for the next row. */
export interface CrewDefaults {
  pass: RowWorkPass;
  crewSize: number;
  /** The last row's finish, the next row's start when it is the same day. */
  lastFinishedAt?: string;
}

export function readCrewDefaults(owner: string): CrewDefaults | undefined {
  try {
    const raw = localStorage.getItem(LOCAL.rowWorkDefaults(owner));
    return raw ? (JSON.parse(raw) as CrewDefaults) : undefined;
  } catch {
    return undefined;
  }
}

export function saveCrewDefaults(owner: string, defaults: CrewDefaults) {
  try {
    localStorage.setItem(LOCAL.rowWorkDefaults(owner), JSON.stringify(defaults));
  } catch {
    // A full or blocked storage only loses the convenience, never the record.
  }
}

/** Rows done end to end in each pass this season: the server's copy plus this phone's queued records. */
export function useDoneRows(blockId: string, rowLengths: Map<number, number> | undefined) {
  const server = useQuery({
    queryKey: ['row-work-done', blockId],
    networkMode: 'always',
    staleTime: 30_000,
    queryFn: () => apiGet<DoneRows>(`/api/field/blocks/${blockId}/row-work`),
  });
  const [queued, setQueued] = useState<RowWorkDraft[]>([]);
  useEffect(() => {
    const load = () =>
      void listObservations().then((all) =>
        setQueued(
          all
            .filter((e) => e.collection === ROW_WORK_COLLECTION && e.record.blockId === blockId && e.state !== 'rejected')
            .map((e) => e.record as unknown as RowWorkDraft),
        ),
      );
    load();
    return onOutboxChange(load);
  }, [blockId]);

  const done = new Map<RowWorkPass, Set<number>>();
  for (const [pass, rows] of Object.entries(server.data?.done ?? {}) as [RowWorkPass, number[]][]) done.set(pass, new Set(rows));
  const waiting = new Map<RowWorkPass, Set<number>>();
  for (const r of queued) {
    const length = rowLengths?.get(r.row);
    const whole = (r.fromPosition ?? 1) <= 1 && (r.toPosition === undefined || (length !== undefined && r.toPosition >= length));
    if (!whole) continue;
    if (!waiting.has(r.pass)) waiting.set(r.pass, new Set());
    waiting.get(r.pass)!.add(r.row);
  }
  const isDone = (pass: RowWorkPass, row: number) => done.get(pass)?.has(row) || waiting.get(pass)?.has(row) || false;
  const isWaiting = (pass: RowWorkPass, row: number) => !done.get(pass)?.has(row) && (waiting.get(pass)?.has(row) ?? false);
  return { isDone, isWaiting, loaded: server.isFetched };
}
