import type { BlockReport } from '@/lib/reports/block-report';
import { formatCount, formatShare } from '@/lib/reports/format';
import { formatLengthMm } from '@/lib/units';
import { ChartFrame, HistogramChart } from '../charts';
import { FigureCard, ListTable, ReportFigure, Section } from '../figure';

export function CaneSection({ report, title }: { report: BlockReport; title: string }) {
  const c = report.canes;
  return (
    <Section id="canes" title={title} intro="Base diameters measured at pruning and on the post-harvest walk, judged against the fruit-cane rules.">
      {!c ? (
        <p>No canes were measured on this block in {report.season}.</p>
      ) : (
        <>
          <div className="grid gap-3 sm:grid-cols-3 print:grid-cols-3">
            <FigureCard
              testId="fig-cane-mean"
              label="Mean base diameter"
              value={c.meanDiameterMm === null ? '–' : formatLengthMm(c.meanDiameterMm, report.units)}
              from={`${formatCount(c.measured)} canes measured; median ${c.medianDiameterMm === null ? '–' : formatLengthMm(c.medianDiameterMm, report.units)}`}
            />
            <ReportFigure testId="fig-shade" figure={c.shadeFigure} />
            <FigureCard
              label="Fruit canes"
              value={c.assessed ? formatShare(c.verdicts['fruit-cane'] / c.assessed) : '–'}
              how={c.assessed ? `${c.how} ${formatCount(c.verdicts['fruit-cane'])} of ${formatCount(c.assessed)} measured canes are fruit canes.` : c.how}
              from={`${c.verdicts['fruit-cane']} fruit canes, ${c.verdicts['if-nothing-better']} if nothing better, ${c.verdicts.remove} to remove`}
              source={c.source}
            />
          </div>
          {c.histogram.length > 0 && (
            <ChartFrame title="Canes by base diameter (mm)" summary={c.histogram.map((h) => `${h.label} mm: ${h.count}`).join('; ')}>
              <HistogramChart data={c.histogram.map((h) => ({ label: h.label, count: h.count }))} xLabel="Base diameter, mm" yLabel="Canes" />
            </ChartFrame>
          )}
          <ListTable
            caption="Canes by diameter band: the same limits that judge each cane."
            columns={['Band', 'Canes']}
            rows={c.bands.map((b) => ({ key: b.label, cells: [b.label, b.count] }))}
          />
        </>
      )}
    </Section>
  );
}
