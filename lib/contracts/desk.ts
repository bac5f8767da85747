/** The Desk: what /api/desk and /api/desk/seen answer. */
import type { Desk } from '@/lib/desk/types';

export type { Desk };

export interface DeskAnswer {
  desk: Desk;
}

/** The manager's look: the Desk's new findings start from `since`. */
export interface DeskLook {
  since: string;
}
