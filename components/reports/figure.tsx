import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';
import { formatCount } from '@/lib/reports/format';

/**
 * How a number is worked out and where the method comes from: behind a "How this is worked out"
 * disclosure on screen, printed in small type under the figure on paper (a closed disclosure does not print).
 */
export function Working({ how, source, className }: { how?: string; source?: string; className?: string }) {
  if (!how && !source) return null;
  const body = (
    <>
      {how && <span className="block">{how}</span>}
      {source && <span className="block text-bark-soft">Source: {source}</span>}
    </>
  );
  return (
    <>
      <details className={cn('vw-working text-sm print:hidden', className)}>
        <summary className="min-h-touch cursor-pointer py-2 font-bold text-rootstock">How this is worked out</summary>
        <p className="flex flex-col gap-1 pb-1 break-words">{body}</p>
      </details>
      <p className={cn('hidden flex-col gap-0.5 text-[8pt] break-words print:flex', className)}>{body}</p>
    </>
  );
}

/** What a figure rests on, in one line under it. */
export function From({ from }: { from?: string }) {
  return from ? <p className="text-sm text-bark-soft">{from}</p> : null;
}

export function FigureCard({
  label,
  value,
  how,
  from,
  source,
  testId,
}: {
  label: string;
  value: ReactNode;
  how?: string;
  from?: string;
  source?: string;
  testId?: string;
}) {
  return (
    <div className="flex flex-col gap-1 rounded-xl border-2 border-line bg-panel p-3 break-inside-avoid" data-testid={testId}>
      <span className="text-sm font-bold text-bark-soft">{label}</span>
      <span className="text-2xl font-extrabold" data-testid={testId ? `${testId}-value` : undefined}>
        {value}
      </span>
      <From from={from} />
      <Working how={how} source={source} />
    </div>
  );
}

/** A figure of the report as the library builds it: label, value, working, records and source. */
export function ReportFigure({
  figure,
  value,
  testId,
}: {
  figure: { label: string; text: string; how: string; from: string; source: string };
  value?: ReactNode;
  testId?: string;
}) {
  return <FigureCard testId={testId} label={figure.label} value={value ?? figure.text} how={figure.how} from={figure.from} source={figure.source} />;
}

export function Section({ id, title, intro, children }: { id: string; title: string; intro?: ReactNode; children: ReactNode }) {
  return (
    <section id={id} aria-labelledby={`${id}-title`} className="vw-section flex scroll-mt-4 flex-col gap-3 border-t-2 border-line pt-5">
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

/** The report's many small tables: a header row and one row per item, the first cell naming it. */
export function ListTable({
  caption,
  columns,
  rows,
  testId,
  printedRows,
}: {
  caption: ReactNode;
  columns: readonly string[];
  rows: readonly { key: string; cells: readonly ReactNode[] }[];
  testId?: string;
  /** Rows past this many are left off paper. */
  printedRows?: number;
}) {
  return (
    <ReportTable caption={caption} testId={testId}>
      <thead>
        <tr>
          {columns.map((c) => (
            <th key={c} scope="col">
              {c}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {rows.map((row, i) => (
          <tr key={row.key} className={printedRows !== undefined && i >= printedRows ? 'print:hidden' : undefined}>
            {row.cells.map((cell, j) => (
              <td key={j}>{cell}</td>
            ))}
          </tr>
        ))}
      </tbody>
    </ReportTable>
  );
}

/** Vines to replant by clone and rootstock: the nursery order, for a block or the estate. */
export function StockTable({
  rows,
  caption,
  testId,
}: {
  rows: readonly { clone: string; rootstock: string; vines: number }[];
  caption: ReactNode;
  testId: string;
}) {
  return (
    <ListTable
      testId={testId}
      caption={caption}
      columns={['Clone', 'Rootstock', 'Vines']}
      rows={rows.map((s) => ({ key: `${s.clone}:${s.rootstock}`, cells: [s.clone, s.rootstock, formatCount(s.vines)] }))}
    />
  );
}
