import { cn } from '@/lib/cn';
import type { SlotStatus } from '@/lib/validation/block';

export const STATUS_LABEL: Record<SlotStatus, string> = { planted: 'Planted', missing: 'Missing', dead: 'Dead', replant: 'Replants' };

// Letters as well as colours, so the status reads in glare and for colour-blind eyes.
export const STATUS_STYLE: Record<SlotStatus, string> = {
  planted: 'border-rootstock bg-rootstock-tint text-rootstock',
  missing: 'border-alarm bg-alarm-tint text-alarm',
  dead: 'border-bark bg-bark text-white',
  replant: 'border-cut bg-cut-tint text-cut',
};

export function StatusCounts({ counts, total }: { counts: Record<SlotStatus, number>; total: number }) {
  return (
    <dl className="grid grid-cols-2 gap-2 sm:grid-cols-5" data-testid="status-counts">
      <div className="rounded-lg border-2 border-line bg-panel p-3">
        <dt className="text-sm font-bold text-bark-soft">Planting slots</dt>
        <dd className="text-2xl font-extrabold" data-testid="count-slots">
          {total.toLocaleString('en-US')}
        </dd>
      </div>
      {(Object.keys(STATUS_LABEL) as SlotStatus[]).map((s) => (
        <div key={s} className={cn('rounded-lg border-2 p-3', STATUS_STYLE[s])}>
          <dt className="text-sm font-bold">{STATUS_LABEL[s]}</dt>
          <dd className="text-2xl font-extrabold" data-testid={`count-${s}`}>
            {counts[s].toLocaleString('en-US')}
          </dd>
        </div>
      ))}
    </dl>
  );
}
