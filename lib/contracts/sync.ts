/** Sync: what POST /api/sync, /api/sync/flags, /api/sync/task-updates and /api/sync/row-work answer. */

/**
 * Records per sync request, the most each endpoint takes and what the phone sends when that many
 * wait: the fixed cost of a request (session, settings, HTTP) is shared by more records, and a
 * day's backlog goes up in fewer round trips on a weak signal. A batch too large in bytes is
 * answered 413 and the phone halves it (lib/offline/engine.ts).
 */
export const SYNC_BATCH_LIMIT = 500;

export type SyncStatus = 'created' | 'duplicate' | 'conflict' | 'rejected';

/** One per record sent, in the order sent; `errors` only when the record was rejected. */
export interface SyncResult {
  id: string;
  status: SyncStatus;
  errors?: { field: string; message: string }[];
}

export interface SyncAnswer {
  results: SyncResult[];
}
