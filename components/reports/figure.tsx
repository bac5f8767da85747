import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';
import { formatCount } from '@/lib/reports/format';

/** How a number was computed and what it rests on, printed under it in small type. */
export function How({ how, from, className }: { how?: string; from?: string; className?: string }) {
  if (!how && !from) return null;
  return (
    <p className={cn('text-sm text-bark-soft', className)}>
      {how && <code className="font-mono text-[0.8rem] break-words text-bark">{how}</code>}
      {how && from && <br />}
      {from && <span>{from}</span>}
    </p>
  );
}

export function FigureCard({ label, value, how, from, testId }: { label: string; value: ReactNode; how?: string; from?: string; testId?: string }) {
  return (
    <div className="flex flex-col gap-1 rounded-xl border-2 border-line bg-panel p-3 break-inside-avoid" data-testid={testId}>
      <span className="text-sm font-bold text-bark-soft">{label}</span>
      <span className="text-2xl font-extrabold" data-testid={testId ? `${testId}-value` : undefined}>
        {value}
      </span>
      <How how={how} from={from} />
    </div>
  );
}

export function Section({ id, title, intro, children }: { id: string; title: string; intro?: ReactNode; children: ReactNode }) {
  return (
    <section id={id} aria-labelledby={`${id}-title`} className="vw-section flex flex-col gap-3 border-t-2 border-line pt-5">
      <h2 id={`${id}-title`} className="text-2xl font-extrabold">
        {title}
      </h2>
      {intro && <div className="max-w-3xl text-bark-soft">{intro}</div>}
      {children}
    </section>
  );
}

/** A table that scrolls sideways on a phone and never breaks across a printed page when it fits on one. */
export function ReportTable({ caption, children, testId }: { caption: ReactNode; children: ReactNode; testId?: string }) {
  return (
    <div className="vw-table overflow-x-auto print:overflow-visible" role="region" aria-label={typeof caption === 'string' ? caption : 'Table'} tabIndex={0}>
      <table
        className="w-full border-collapse text-left text-sm [&_tbody_th]:border-b [&_tbody_th]:border-line [&_tbody_th]:font-bold [&_td]:border-b [&_td]:border-line [&_td]:px-2 [&_td]:py-1 [&_th]:px-2 [&_th]:py-1 [&_thead_th]:border-b-2 [&_thead_th]:border-bark [&_thead_th]:align-bottom"
        data-testid={testId}
      >
        <caption className="caption-top pb-1 text-left text-sm text-bark-soft">{caption}</caption>
        {children}
      </table>
    </div>
  );
}

/** Vines to replant by clone and rootstock: the nursery order, for a block or the estate. */
export function StockTable({ rows, caption, testId }: { rows: readonly { clone: string; rootstock: string; vines: number }[]; caption: ReactNode; testId: string }) {
  return (
    <ReportTable testId={testId} caption={caption}>
      <thead>
        <tr>
          <th scope="col">Clone</th>
          <th scope="col">Rootstock</th>
          <th scope="col">Vines</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((s) => (
          <tr key={`${s.clone}:${s.rootstock}`}>
            <td>{s.clone}</td>
            <td>{s.rootstock}</td>
            <td>{formatCount(s.vines)}</td>
          </tr>
        ))}
      </tbody>
    </ReportTable>
  );
}
