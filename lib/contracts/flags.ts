/** Flags: what /api/flags answers. The request schemas stay in lib/validation/flag.ts. */
import type { FlagReason } from '@/lib/validation/flag';

/** One flag as the desk's table reads it. `T` is the time type: Date on the server, ISO text on the wire. */
export interface FlagView<T = string> {
  id: string;
  blockId: string;
  blockName: string;
  vinesPerPanel: number | null;
  row: number;
  position: number;
  toPosition: number;
  reason: FlagReason;
  note: string;
  flaggedAt: T;
  flaggedBy: string | null;
  flaggedByName: string | null;
  status: 'open' | 'closed';
  closedAt: T | null;
  taskId: string | null;
  taskTitle: string | null;
  taskStatus: 'open' | 'done' | 'cancelled' | null;
}

export interface FlagList {
  flags: FlagView[];
}

export interface FlagOne {
  flag: FlagView;
}
