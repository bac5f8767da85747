import type { BlockReport } from '@/lib/reports/block-report';
import { RAVAZ_WORDS } from '@/lib/reports/block/balance';
import { formatWeightKg } from '@/lib/reports/format';
import { formatCount } from '@/lib/units';
import { FigureCard, ReportFigure, Section } from '../figure';
import type { EstimateState } from './estimate-state';
import { cropPerArea, labourValue } from './words';

export function GlanceSection({ report, state, title }: { report: BlockReport; state: EstimateState; title: string }) {
  const { crop, labour } = state;
  const units = report.units;
  return (
    <Section id="glance" title={title}>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3 print:grid-cols-3">
        <ReportFigure testId="fig-scouted" figure={report.scouting.coverage} />
        {report.budbreak && <ReportFigure testId="fig-weak" figure={{ ...report.budbreak.weakFigure, label: 'Vines with weak budbreak' }} />}
        <FigureCard
          testId="fig-crop"
          label="Crop estimate"
          value={crop.kg === null ? 'needs inputs' : formatWeightKg(crop.kg, units)}
          how={crop.how}
          from={crop.kg === null ? 'Enter the missing inputs under Crop estimate.' : cropPerArea(crop, units)}
          source={report.crop.source}
        />
        <FigureCard
          testId="fig-labour"
          label="Pruning labour"
          value={labourValue(labour)}
          how={labour.how}
          from={`${formatCount(report.labour.basis.vines)} standing vines, ${report.block.trainingSystem}-pruned`}
          source={report.labour.source}
        />
        {report.ravaz && (
          <ReportFigure testId="fig-ravaz" figure={report.ravaz.index} value={`${report.ravaz.index.text}, ${RAVAZ_WORDS[report.ravaz.reading]}`} />
        )}
        <FigureCard testId="fig-replant" label="Vines to replant" value={formatCount(report.replant.total)} from={report.replant.how} />
      </div>
    </Section>
  );
}
