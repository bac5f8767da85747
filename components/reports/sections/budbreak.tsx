import type { BlockReport } from '@/lib/reports/block-report';
import { ChartFrame, HistogramChart } from '../charts';
import { ReportFigure, Section } from '../figure';

export function BudbreakSection({ report, title }: { report: BlockReport; title: string }) {
  const b = report.budbreak;
  return (
    <Section id="budbreak" title={title} intro="Shoots that pushed from the buds left at pruning, each vine's latest spring check.">
      {!b ? (
        <p>No budbreak checks were recorded on this block in {report.season}.</p>
      ) : (
        <>
          <div className="grid gap-3 sm:grid-cols-2 print:grid-cols-2">
            <ReportFigure testId="fig-budbreak" figure={b.pooled} />
            <ReportFigure figure={b.weakFigure} />
          </div>
          <ChartFrame title="Vines by budbreak" summary={b.histogram.map((h) => `${h.label}: ${h.count} vines`).join('; ')}>
            <HistogramChart
              data={b.histogram.map((h) => ({ label: h.label, count: h.count, below: h.to <= b.weakBelowPercent }))}
              xLabel="Buds that pushed"
              yLabel="Vines"
              threshold={{
                at: b.histogram.find((h) => h.from <= b.weakBelowPercent && b.weakBelowPercent < h.to)?.label ?? '',
                label: `weak under ${b.weakBelowPercent}%`,
              }}
            />
          </ChartFrame>
        </>
      )}
    </Section>
  );
}
