import type { BlockReport } from '@/lib/reports/block-report';
import { formatCount, formatPercent } from '@/lib/reports/format';
import { EstimateInput, PrintedInput } from '../estimate-input';
import { FigureCard, ListTable, ReportFigure, Section } from '../figure';
import type { EstimateState } from './estimate-state';

const ADVICE_WORDS = {
  'prune-normally': 'Prune to the usual target: few primary buds died.',
  'leave-extra': 'Leave that percentage more buds, then thin shoots after budbreak.',
  'minimal-pruning': 'More than half the primary buds died: prune minimally, or wait until after budbreak to see what pushed, then thin.',
} as const;

export function BudInjurySection({ report, state, title }: { report: BlockReport; state: EstimateState; title: string }) {
  const i = report.budInjury;
  const { texts, read, inputs, change, used, adjusted } = state;
  return (
    <Section
      id="bud-injury"
      title={title}
      intro={
        i
          ? `Buds cut open before pruning; under ${i.limits.extraFromPercent}% dead primaries prune as usual (Cornell NNY), from there to ${i.limits.minimalAbovePercent}% leave that percentage more buds (Cornell NNY), over ${i.limits.minimalAbovePercent}% prune minimally or wait until after budbreak (Purdue; Michigan State).`
          : 'Buds cut open before pruning, to adjust the bud target for winter injury.'
      }
    >
      {i ? (
        <>
          <div className="grid gap-3 sm:grid-cols-3 print:grid-cols-3">
            <ReportFigure testId="fig-bud-kill" figure={i.kill} />
            <div className="flex flex-col gap-1">
              <EstimateInput
                id="budTarget"
                label="Bud target per vine before injury"
                text={texts.budTarget}
                error={read.budTarget.error}
                input={inputs.budTarget}
                onChange={(v) => change('budTarget', v)}
              />
              <ul className="hidden list-disc pl-5 print:block">
                <PrintedInput label="Bud target per vine" value={read.budTarget.value} source={used('budTarget').source} />
              </ul>
            </div>
            <FigureCard
              testId="fig-bud-adjusted"
              label="Adjusted bud target per vine"
              value={!adjusted ? 'enter a target' : adjusted.buds === null ? 'prune minimally' : formatCount(adjusted.buds)}
              how={adjusted?.how}
              from={adjusted ? ADVICE_WORDS[adjusted.advice] : undefined}
              source={adjusted?.source}
            />
          </div>
          <ListTable
            caption="Samples by row: dead primaries ÷ buds cut × 100 in each row."
            columns={['Row', 'Samples', 'Buds cut', 'Primaries dead', 'Dead']}
            rows={i.byRow.map((r) => ({ key: String(r.row), cells: [r.row, r.samples, r.budsCut, r.primariesDead, formatPercent(r.killPercent)] }))}
          />
        </>
      ) : (
        <p>No winter bud-injury samples were recorded on this block in {report.season}.</p>
      )}
    </Section>
  );
}
