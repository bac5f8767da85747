import { cn } from '@/lib/cn';
import type { RowState } from '@/lib/work/progress';

const CELL: Record<RowState, string> = {
  done: 'bg-rootstock',
  partly: 'bg-cut',
  none: 'bg-line',
};

/** One cell per row, in row order: done, partly done or not started. Read aloud as counts. */
export function PassStrip({ label, rows, states }: { label: string; rows: number[]; states: RowState[] }) {
  const count = (s: RowState) => states.filter((x) => x === s).length;
  return (
    <div
      role="img"
      aria-label={`${label}: ${count('done')} rows done, ${count('partly')} partly done, ${count('none')} not started`}
      className="flex h-8 w-full overflow-hidden rounded border-2 border-bark"
      data-testid="pass-strip"
    >
      {states.map((s, i) => (
        <span
          key={rows[i]}
          title={`Row ${rows[i]}: ${s === 'none' ? 'not started' : s === 'partly' ? 'partly done' : 'done'}`}
          data-state={s}
          className={cn('h-full min-w-px flex-1', CELL[s], i > 0 && 'border-l border-panel/40')}
        />
      ))}
    </div>
  );
}

export function StripLegend() {
  return (
    <p className="flex flex-wrap gap-4 text-sm">
      {(['done', 'partly', 'none'] as const).map((s) => (
        <span key={s} className="flex items-center gap-1">
          <span className={cn('inline-block size-4 rounded-sm border border-bark', CELL[s])} aria-hidden />
          {s === 'done' ? 'Row done' : s === 'partly' ? 'Partly done' : 'Not started'}
        </span>
      ))}
    </p>
  );
}
