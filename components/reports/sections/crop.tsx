import type { BlockReport } from '@/lib/reports/block-report';
import { inputWords } from '@/lib/reports/estimates';
import { formatCount, formatNumber, formatWeightKg } from '@/lib/reports/format';
import { formatAreaM2 } from '@/lib/units';
import { EstimateInput, PrintedInput } from '../estimate-input';
import { Section, Working } from '../figure';
import type { EstimateState } from './estimate-state';
import { cropPerArea } from './words';

export function CropSection({ report, state, title }: { report: BlockReport; state: EstimateState; title: string }) {
  const { texts, read, inputs, change, used, crop } = state;
  const units = report.units;
  const t = report.crop.target;
  return (
    <Section
      id="crop"
      title={title}
      intro={
        <>
          Bearing vines × buds kept per vine × budbreak × clusters per shoot × cluster weight. Inputs marked &quot;default&quot; are not the block&apos;s own:
          enter yours.
          <span className="print:hidden"> Change an input to see the estimate follow; the address keeps it for printing and sharing.</span>
        </>
      }
    >
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4 print:hidden" data-testid="crop-inputs">
        <EstimateInput
          id="budsPerVine"
          label="Buds kept per vine"
          text={texts.budsPerVine}
          error={read.budsPerVine.error}
          input={inputs.budsPerVine}
          onChange={(v) => change('budsPerVine', v)}
        />
        <EstimateInput
          id="budbreakPercent"
          label="Budbreak"
          unit="%"
          text={texts.budbreakPercent}
          error={read.budbreakPercent.error}
          input={inputs.budbreakPercent}
          onChange={(v) => change('budbreakPercent', v)}
        />
        <EstimateInput
          id="clustersPerShoot"
          label="Clusters per shoot"
          text={texts.clustersPerShoot}
          error={read.clustersPerShoot.error}
          input={inputs.clustersPerShoot}
          onChange={(v) => change('clustersPerShoot', v)}
        />
        <EstimateInput
          id="clusterWeightG"
          label="Cluster weight"
          unit="g"
          text={texts.clusterWeightG}
          error={read.clusterWeightG.error}
          input={inputs.clusterWeightG}
          onChange={(v) => change('clusterWeightG', v)}
        />
        <EstimateInput
          id="clustersPerVine"
          label="Clusters counted per vine (in place of buds × budbreak × clusters a shoot)"
          text={texts.clustersPerVine}
          error={read.clustersPerVine.error}
          input={inputs.clustersPerVine}
          onChange={(v) => change('clustersPerVine', v)}
        />
        <EstimateInput
          id="lagClusterWeightG"
          label={`Weight of a cluster at lag phase (× ${formatNumber(report.crop.basis.lagPhaseMultiplier ?? 2, 2)} for harvest)`}
          unit="g"
          text={texts.lagClusterWeightG}
          error={read.lagClusterWeightG.error}
          input={inputs.lagClusterWeightG}
          onChange={(v) => change('lagClusterWeightG', v)}
        />
      </div>
      <ul className="hidden list-disc pl-5 print:block">
        <PrintedInput label="Bearing vines" value={report.crop.basis.vines} source={report.crop.basis.vinesSource} />
        <PrintedInput label="Buds kept per vine" value={read.budsPerVine.value} source={used('budsPerVine').source} />
        <PrintedInput label="Budbreak" unit="%" value={read.budbreakPercent.value} source={used('budbreakPercent').source} />
        <PrintedInput label="Clusters per shoot" value={read.clustersPerShoot.value} source={used('clustersPerShoot').source} />
        <PrintedInput label="Cluster weight" unit="g" value={read.clusterWeightG.value} source={used('clusterWeightG').source} />
        {read.clustersPerVine.value !== null && (
          <PrintedInput label="Clusters per vine" value={read.clustersPerVine.value} source={used('clustersPerVine').source} />
        )}
        {read.lagClusterWeightG.value !== null && (
          <PrintedInput label="Weight of a cluster at lag phase" unit="g" value={read.lagClusterWeightG.value} source={used('lagClusterWeightG').source} />
        )}
      </ul>
      <p className="print:hidden">
        Bearing vines: <strong>{formatCount(report.crop.basis.vines)}</strong> ({report.crop.basis.vinesSource}).
      </p>
      <div className="rounded-xl border-2 border-bark bg-panel p-4 break-inside-avoid" data-testid="crop-estimate" aria-live="polite">
        {crop.kg === null ? (
          <p className="text-lg font-bold">Enter {crop.missing.map(inputWords).join(' and ')} to estimate the crop.</p>
        ) : (
          <>
            <p className="text-2xl font-extrabold" data-testid="crop-total">
              {formatWeightKg(crop.kg, units)}
            </p>
            <p>
              {formatWeightKg(crop.kgPerVine ?? 0, units, 2)} a vine; {cropPerArea(crop, units)}
            </p>
            <p className="text-sm" data-testid="crop-working">
              {crop.how}
            </p>
          </>
        )}
        <p className="text-sm" data-testid="crop-rests-on">
          Rests on: {state.cropRestsOn}.
        </p>
        <p className="text-sm text-bark-soft">
          Over {formatAreaM2(report.block.areaM2, units)} of planted slots. Estimates are often 30% off; within 10% is a good one.
        </p>
        <Working
          source={report.crop.source}
          how={
            crop.kg === null
              ? undefined
              : 'Shoots a vine = buds kept × budbreak; clusters a vine = shoots × clusters per shoot (or the clusters counted); crop = bearing vines × clusters a vine × cluster weight.'
          }
        />
      </div>
      <p data-testid="crop-sampling">
        To know the mean yield a vine within ±{report.crop.sampling.marginPercent}%, weigh or count{' '}
        <strong>{formatCount(report.crop.sampling.vines)} vines</strong> at random: vine yields vary by {formatNumber(report.crop.sampling.cvPercent, 0)}% (
        {report.crop.sampling.cvSource}).
      </p>
      <Working how={report.crop.sampling.how} source={report.crop.sampling.source} />
      {t && (
        <>
          <p data-testid="crop-target">
            The vines&apos; size ({formatWeightKg(t.pruningKgPerVine, units, 2)} of prunings a vine) ripens about {formatWeightKg(t.lowKgPerVine, units, 1)}–
            {formatWeightKg(t.highKgPerVine, units, 1)} a vine
            {t.targetKgPerVine !== null ? `, ${formatWeightKg(t.targetKgPerVine, units, 1)} at the balanced Ravaz index of 15` : ''} ({t.from}).
          </p>
          <Working how={t.how} source={t.source} />
        </>
      )}
    </Section>
  );
}
