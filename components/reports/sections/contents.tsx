import type { BlockReport } from '@/lib/reports/block-report';

export interface ContentsEntry {
  id: string;
  title: string;
}

/** The report's sections in page order; the compare section only when there is a season before. */
export function reportContents(report: BlockReport, compared: number | null): ContentsEntry[] {
  return [
    { id: 'glance', title: 'At a glance' },
    { id: 'incidence', title: 'Incidence by problem' },
    { id: 'budbreak', title: 'Budbreak' },
    { id: 'canes', title: 'Canes' },
    { id: 'bud-load', title: 'Pruning records: buds kept and balanced pruning' },
    { id: 'pruning-checks', title: 'Pruning checks' },
    { id: 'balance', title: 'Harvest and vine balance' },
    { id: 'crop', title: 'Crop estimate' },
    { id: 'labour', title: 'Pruning labour' },
    { id: 'bud-injury', title: 'Winter bud injury' },
    { id: 'tasks', title: 'Tasks' },
    { id: 'replant', title: 'Vines to replant' },
    ...(compared === null ? [] : [{ id: 'compare', title: `${compared} and ${report.season} side by side` }]),
    { id: 'method', title: 'How these figures are made' },
  ];
}

export const titleOf = (entries: ContentsEntry[], id: string) => entries.find((e) => e.id === id)?.title ?? id;

/** A contents list at the top: links on screen, the same list on paper so a reader finds a section. */
export function Contents({ entries }: { entries: ContentsEntry[] }) {
  return (
    <nav aria-labelledby="contents-title" className="vw-contents rounded-xl border-2 border-line bg-panel p-4" data-testid="report-contents">
      <h2 id="contents-title" className="text-lg font-bold">
        Contents
      </h2>
      <ol className="mt-1 list-decimal columns-1 gap-6 pl-6 sm:columns-2 print:columns-2">
        {entries.map((e) => (
          <li key={e.id}>
            <a href={`#${e.id}`} className="inline-block py-1 font-bold text-rootstock underline">
              {e.title}
            </a>
          </li>
        ))}
      </ol>
    </nav>
  );
}
