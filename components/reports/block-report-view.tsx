'use client';

import Link from 'next/link';
import type { BlockReportResponse } from '@/lib/reports/api';
import { ReportToolbar } from './report-toolbar';
import { BalanceSection } from './sections/balance';
import { BudInjurySection } from './sections/bud-injury';
import { BudLoadSection } from './sections/bud-load';
import { BudbreakSection } from './sections/budbreak';
import { CaneSection } from './sections/canes';
import { CompareSection } from './sections/compare';
import { Contents, reportContents, titleOf } from './sections/contents';
import { CropSection } from './sections/crop';
import { useEstimateInputs } from './sections/estimate-state';
import { GlanceSection } from './sections/glance';
import { IncidenceSection } from './sections/incidence';
import { LabourSection } from './sections/labour';
import { BlockFacts, MethodSection } from './sections/method';
import { PruningCheckSection } from './sections/pruning-checks';
import { ReplantSection, TaskSection } from './sections/tasks';

/** A block's season report: a contents list, then one section per part (components/reports/sections). */
export function BlockReportView({ data }: { data: BlockReportResponse }) {
  const { report, comparison, seasons } = data;
  const state = useEstimateInputs(report);
  const contents = reportContents(report, comparison ? comparison.previous : null);
  const title = (id: string) => titleOf(contents, id);
  const exportHref = `/api/reports/observations.csv?season=${report.season}&blockId=${report.block.id}`;

  return (
    <article className="vw-report flex flex-col gap-6" data-testid="block-report">
      <header className="flex flex-col gap-2">
        <p className="text-bark-soft print:hidden">
          <Link href={`/reports?season=${report.season}`}>All blocks</Link>
        </p>
        <h1 className="text-3xl font-extrabold">
          {report.block.name}: season {report.season}
        </h1>
        {!report.period.from.startsWith(`${report.season}-01-01`) && (
          <p data-testid="season-span">
            From {report.period.from.slice(0, 10)} up to {report.period.to.slice(0, 10)}
          </p>
        )}
        <BlockFacts report={report} />
        <ReportToolbar
          seasons={seasons}
          season={report.season}
          startMonth={Number(report.period.from.slice(5, 7))}
          compare={comparison ? comparison.previous : 'none'}
          exportHref={exportHref}
          links={[
            { href: `/reports/${report.block.id}/weights?season=${report.season}`, label: 'Yields and pruning weights' },
            { href: `/grid/${report.block.id}`, label: 'Row grid' },
          ]}
        />
      </header>

      <Contents entries={contents} />
      <GlanceSection report={report} state={state} title={title('glance')} />
      <IncidenceSection report={report} title={title('incidence')} />
      <BudbreakSection report={report} title={title('budbreak')} />
      <CaneSection report={report} title={title('canes')} />
      <BudLoadSection report={report} title={title('bud-load')} />
      <PruningCheckSection report={report} title={title('pruning-checks')} />
      <BalanceSection report={report} title={title('balance')} />
      <CropSection report={report} state={state} title={title('crop')} />
      <LabourSection report={report} state={state} title={title('labour')} />
      <BudInjurySection report={report} state={state} title={title('bud-injury')} />
      <TaskSection report={report} title={title('tasks')} />
      <ReplantSection report={report} title={title('replant')} />
      {comparison && <CompareSection comparison={comparison} vinesPerPanel={report.block.vinesPerPanel} title={title('compare')} />}
      <MethodSection report={report} title={title('method')} />
    </article>
  );
}
