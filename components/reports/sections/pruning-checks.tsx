import type { BlockReport } from '@/lib/reports/block-report';
import { formatCount, formatNumber } from '@/lib/reports/format';
import { ReportFigure, Section, Working } from '../figure';

export function PruningCheckSection({ report, title }: { report: BlockReport; title: string }) {
  const c = report.pruningChecks;
  return (
    <Section
      id="pruning-checks"
      title={title}
      intro="A crew lead counts what a pruner left on a vine against the bud target the crew was given. Records of the work, not problems."
    >
      {!c ? (
        <p>No pruning checks were made on this block in {report.season}.</p>
      ) : (
        <>
          <div className="grid gap-3 sm:grid-cols-2 print:grid-cols-2">
            <ReportFigure testId="fig-check-buds" figure={c.meanLeft} />
            <div className="flex flex-col gap-1 rounded-xl border-2 border-line bg-panel p-3 break-inside-avoid" data-testid="pruning-check-target">
              <span className="text-sm font-bold text-bark-soft">Against the target</span>
              {c.withTarget === 0 ? (
                <span>No check carried a target.</span>
              ) : (
                <span>
                  <strong className="text-2xl font-extrabold">
                    {formatCount(c.within)} of {formatCount(c.withTarget)}
                  </strong>{' '}
                  vines on target (within {c.fineWithinPercent}% of {formatNumber(c.meanTarget ?? 0)} buds on average); {formatCount(c.under)} with too few
                  buds, {formatCount(c.over)} with too many.
                </span>
              )}
              <Working how={c.how} source={c.source} />
            </div>
          </div>
          <p data-testid="pruning-check-kept">
            Left on a vine, on average: {formatNumber(c.kept.canes)} canes or spurs carrying {formatNumber(c.kept.budsOnCanes)} buds, and{' '}
            {formatNumber(c.kept.renewalSpurs)} renewal spurs; {formatCount(c.checks)} checks{c.pruners ? ` of ${formatCount(c.pruners)} pruners` : ''}.
          </p>
        </>
      )}
    </Section>
  );
}
