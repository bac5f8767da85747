import { RecordedLabourNote } from '@/components/work/recorded-labour';
import type { BlockReport } from '@/lib/reports/block-report';
import { formatCount, formatNumber } from '@/lib/reports/format';
import { EstimateInput, PrintedInput } from '../estimate-input';
import { Section, Working } from '../figure';
import type { EstimateState } from './estimate-state';
import { labourValue, money } from './words';

export function LabourSection({ report, state, title }: { report: BlockReport; state: EstimateState; title: string }) {
  const { texts, read, inputs, change, used, labour } = state;
  return (
    <Section
      id="labour"
      title={title}
      intro="Standing vines × minutes per vine ÷ 60, at the crew's hourly cost. Cane pruning is the slower, costlier kind: canes are pulled from the wires and new ones tied down."
    >
      <div className="grid gap-4 sm:grid-cols-2 print:hidden" data-testid="labour-inputs">
        <EstimateInput
          id="minutesPerVine"
          label="Minutes per vine"
          unit="min"
          text={texts.minutesPerVine}
          error={read.minutesPerVine.error}
          input={inputs.minutesPerVine}
          onChange={(v) => change('minutesPerVine', v)}
        />
        <EstimateInput
          id="hourlyCost"
          label="Hourly cost"
          unit="per hour"
          text={texts.hourlyCost}
          error={read.hourlyCost.error}
          input={inputs.hourlyCost}
          onChange={(v) => change('hourlyCost', v)}
        />
      </div>
      <ul className="hidden list-disc pl-5 print:block">
        <PrintedInput label="Standing vines" value={report.labour.basis.vines} source="planted and replant slots" />
        <PrintedInput label="Minutes per vine" value={read.minutesPerVine.value} source={used('minutesPerVine').source} />
        <PrintedInput label="Hourly cost" value={read.hourlyCost.value} source={used('hourlyCost').source} />
      </ul>
      <div className="rounded-xl border-2 border-bark bg-panel p-4 break-inside-avoid" data-testid="labour-estimate" aria-live="polite">
        {labour.hours === null || labour.cost === null ? (
          <p className="text-lg font-bold">Enter the minutes per vine and the hourly cost to estimate the labour.</p>
        ) : (
          <>
            <p className="text-2xl font-extrabold" data-testid="labour-hours">
              {labourValue(labour).replace(' h,', ' hours,')}
            </p>
            <p data-testid="labour-working">{labour.how}.</p>
            <p>
              {formatCount(report.labour.basis.vines)} vines, {report.block.trainingSystem}-pruned;{' '}
              {report.units === 'metric' ? `${formatNumber(labour.hoursPerHa ?? 0, 0)} h/ha` : `${formatNumber(labour.hoursPerAcre ?? 0, 0)} h/acre`}.
            </p>
            {labour.alternative && (
              <p className="text-bark-soft">
                {labour.alternative.trainingSystem === 'spur' ? 'Spur-pruned' : 'Cane-pruned'} at the default{' '}
                {formatNumber(labour.alternative.minutesPerVine, 2)} min a vine it would take {formatNumber(labour.alternative.hours, 0)} hours (
                {money(labour.alternative.cost)}).
              </p>
            )}
          </>
        )}
        <Working how="Hours = vines × minutes a vine ÷ 60; cost = hours × the hourly rate." source={report.labour.source} />
      </div>
      {report.labour.recorded && (
        <RecordedLabourNote recorded={report.labour.recorded} estimateHours={labour.hours} blockId={report.block.id} season={report.season} />
      )}
    </Section>
  );
}
