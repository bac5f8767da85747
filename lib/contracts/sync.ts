/** Sync: what POST /api/sync, /api/sync/flags, /api/sync/task-updates and /api/sync/row-work answer. */

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
