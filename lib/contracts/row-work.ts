/** Row work: what /api/blocks/:id/progress answers (the phone's done rows are in ./field). */
import type { PassProgress } from '@/lib/work/progress';

export type { PassProgress };

export interface BlockPassProgress {
  season: number;
  passes: PassProgress[];
}
