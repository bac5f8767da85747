import Link from 'next/link';
import { formatCount } from '@/lib/units';
import { formatHours, formatMoney } from '@/lib/work/format';
import type { RecordedLabour } from '@/lib/work/recorded';

/** Beside the season report's pruning estimate: what the crews recorded so far. */
export function RecordedLabourNote({
  recorded,
  estimateHours,
  blockId,
  season,
}: {
  recorded: RecordedLabour;
  estimateHours: number | null;
  blockId: string;
  season: number;
}) {
  return (
    <div className="rounded-xl border-2 border-line bg-panel p-4 break-inside-avoid" data-testid="labour-recorded">
      <p className="text-lg font-bold">
        Recorded pruning: {formatHours(recorded.pruningHours)} on {formatCount(recorded.pruningVines)} vines, cost {formatMoney(recorded.pruningCost)}
        {estimateHours !== null && estimateHours > 0 && ` (${Math.round((recorded.pruningHours / estimateHours) * 100)}% of the estimated hours)`}.
      </p>
      <p>
        All row work this season (every pass): {formatHours(recorded.allHours)}, cost {formatMoney(recorded.allCost)}.{' '}
        <Link href={`/work/${blockId}?season=${season}`} className="print:hidden">
          Work progress
        </Link>
      </p>
    </div>
  );
}
