'use client';

import Link from 'next/link';
import { usePathname, useSearchParams } from 'next/navigation';
import { useMemo, useState } from 'react';
import { kindLabel, vineAddress } from '@/lib/grid/labels';
import type { BlockReportResponse } from '@/lib/reports/api';
import { adjustForBudInjury, type BlockReport } from '@/lib/reports/block-report';
import { cropEstimate, cropRestsOn, labourEstimate, type InputValue } from '@/lib/reports/estimates';
import { RecordedLabourNote } from '@/components/work/recorded-labour';
import { formatCount, formatInterval, formatNumber, formatPercent, formatShare, formatWeightKg } from '@/lib/reports/format';
import { formatAreaM2, formatLengthM, formatLengthMm, type UnitSystem } from '@/lib/units';
import { reportOptionsSchema } from '@/lib/validation/report';
import { CompareChart, ChartFrame, HistogramChart, IncidenceChart, RowCountChart } from './charts';
import { EstimateInput, PrintedInput } from './estimate-input';
import { FigureCard, How, ReportTable, Section, StockTable } from './figure';
import { ReportToolbar } from './report-toolbar';

type Key = 'budsPerVine' | 'budbreakPercent' | 'clustersPerShoot' | 'clusterWeightG' | 'clustersPerVine' | 'lagClusterWeightG' | 'minutesPerVine' | 'hourlyCost' | 'budTarget';

const NO_INPUT: InputValue = { value: null, source: '', defaultValue: null, defaultSource: '' };

const RAVAZ_WORDS = { 'under-cropped': 'under-cropped (more wood than fruit)', balanced: 'balanced', 'over-cropped': 'over-cropped (more fruit than the wood can ripen)' } as const;
const ADVICE_WORDS = {
  'prune-normally': 'Prune to the usual target: few primary buds died.',
  'leave-extra': 'Leave that percentage more buds, then thin shoots after budbreak.',
  'minimal-pruning': 'More than half the primary buds died: prune minimally, or wait until after budbreak to see what pushed, then thin.',
} as const;

function initialText(input: InputValue) {
  return input.source === 'entered' && input.value !== null ? String(input.value) : input.defaultValue === null ? '' : String(input.defaultValue);
}

/** Reads one input: empty means the default; anything else must pass the report schema. */
function readInput(key: Key, text: string, input: InputValue): { value: number | null; error?: string; entered: boolean } {
  if (text.trim() === '') return { value: input.defaultValue, entered: false };
  const parsed = reportOptionsSchema.shape[key].safeParse(text.trim());
  if (!parsed.success || parsed.data === undefined) return { value: null, error: parsed.success ? 'Enter a number' : parsed.error.issues[0]!.message, entered: true };
  return { value: parsed.data as number, entered: Number(parsed.data) !== input.defaultValue };
}

const money = (v: number) => formatNumber(v, 0);

// Long lists are cut on paper; the screen and the CSV keep them whole.
const PRINTED_ROWS = 20;

export function BlockReportView({ data }: { data: BlockReportResponse }) {
  const { report, comparison, seasons } = data;
  const pathname = usePathname();
  const search = useSearchParams();
  const units = report.units;
  const inputs: Record<Key, InputValue> = useMemo(
    () => ({
      ...report.crop.inputs,
      clustersPerVine: report.crop.inputs.clustersPerVine ?? NO_INPUT,
      lagClusterWeightG: report.crop.inputs.lagClusterWeightG ?? NO_INPUT,
      ...report.labour.inputs,
      budTarget: report.budInjury?.target ?? { value: null, source: '', defaultValue: null, defaultSource: '' },
    }),
    [report],
  );
  const [texts, setTexts] = useState<Record<Key, string>>(() => Object.fromEntries(Object.entries(inputs).map(([k, v]) => [k, initialText(v)])) as Record<Key, string>);
  const read = Object.fromEntries((Object.keys(inputs) as Key[]).map((k) => [k, readInput(k, texts[k], inputs[k])])) as Record<Key, ReturnType<typeof readInput>>;
  const used = (k: Key): InputValue => ({ ...inputs[k], value: read[k].value, source: read[k].entered ? 'entered' : inputs[k].defaultSource });

  const cropInputs = {
    budsPerVine: used('budsPerVine'),
    budbreakPercent: used('budbreakPercent'),
    clustersPerShoot: used('clustersPerShoot'),
    clusterWeightG: used('clusterWeightG'),
    clustersPerVine: used('clustersPerVine'),
    lagClusterWeightG: used('lagClusterWeightG'),
  };
  const crop = cropEstimate(report.crop.basis, cropInputs);
  const labour = labourEstimate(report.labour.basis, { minutesPerVine: used('minutesPerVine'), hourlyCost: used('hourlyCost') });
  const adjusted = report.budInjury ? adjustForBudInjury(read.budTarget.value, report.budInjury.kill.value!) : null;

  function change(key: Key, text: string) {
    const next = { ...texts, [key]: text };
    setTexts(next);
    // Kept in the address without asking the server again, so printing, sharing and reloading keep the inputs.
    const params = new URLSearchParams(search.toString());
    const r = readInput(key, text, inputs[key]);
    if (r.entered && r.value !== null && !r.error) params.set(key, String(r.value));
    else if (!r.entered) params.delete(key);
    window.history.replaceState(null, '', `${pathname}?${params.toString()}`);
  }

  const exportHref = `/api/reports/observations.csv?season=${report.season}&blockId=${report.block.id}`;
  const compare = comparison ? comparison.previous : 'none';

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
          compare={compare}
          exportHref={exportHref}
          links={[
            { href: `/reports/${report.block.id}/weights?season=${report.season}`, label: 'Yields and pruning weights' },
            { href: `/grid/${report.block.id}`, label: 'Row grid' },
          ]}
        />
      </header>

      <Section id="glance" title="At a glance">
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3 print:grid-cols-3">
          <FigureCard testId="fig-scouted" label="Vines scouted" value={report.scouting.coverage.text} how={report.scouting.coverage.how} from={report.scouting.coverage.from} />
          {report.budbreak && (
            <FigureCard testId="fig-weak" label="Vines with weak budbreak" value={report.budbreak.weakFigure.text} how={report.budbreak.weakFigure.how} from={report.budbreak.weakFigure.from} />
          )}
          <FigureCard
            testId="fig-crop"
            label="Crop estimate"
            value={crop.kg === null ? 'needs inputs' : formatWeightKg(crop.kg, units)}
            how={crop.how}
            from={crop.kg === null ? undefined : cropPerArea(crop, units)}
          />
          <FigureCard
            testId="fig-labour"
            label="Pruning labour"
            value={labour.hours === null ? 'needs inputs' : `${formatCount(Math.round(labour.hours))} h`}
            how={labour.how}
            from={labour.cost === null ? undefined : `cost ${money(labour.cost)} at ${formatNumber(read.hourlyCost.value ?? 0, 2)} an hour`}
          />
          {report.ravaz && <FigureCard testId="fig-ravaz" label={report.ravaz.index.label} value={`${report.ravaz.index.text}, ${report.ravaz.reading}`} how={report.ravaz.index.how} from={report.ravaz.index.from} />}
          <FigureCard testId="fig-replant" label="Vines to replant" value={formatCount(report.replant.total)} from={report.replant.how} />
        </div>
      </Section>

      <IncidenceSection report={report} />
      <BudbreakSection report={report} />
      <CaneSection report={report} />
      <BudLoadSection report={report} />
      <BalanceSection report={report} />

      <Section
        id="crop"
        title="Crop estimate"
        intro={
          <>
            Bearing vines × buds kept per vine × budbreak × clusters per shoot × cluster weight.
            <span className="print:hidden"> Change an input to see the estimate follow; the address keeps it for printing and sharing.</span>
          </>
        }
      >
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4 print:hidden" data-testid="crop-inputs">
          <EstimateInput id="budsPerVine" label="Buds kept per vine" text={texts.budsPerVine} error={read.budsPerVine.error} input={inputs.budsPerVine} onChange={(t) => change('budsPerVine', t)} />
          <EstimateInput id="budbreakPercent" label="Budbreak" unit="%" text={texts.budbreakPercent} error={read.budbreakPercent.error} input={inputs.budbreakPercent} onChange={(t) => change('budbreakPercent', t)} />
          <EstimateInput id="clustersPerShoot" label="Clusters per shoot" text={texts.clustersPerShoot} error={read.clustersPerShoot.error} input={inputs.clustersPerShoot} onChange={(t) => change('clustersPerShoot', t)} />
          <EstimateInput id="clusterWeightG" label="Cluster weight" unit="g" text={texts.clusterWeightG} error={read.clusterWeightG.error} input={inputs.clusterWeightG} onChange={(t) => change('clusterWeightG', t)} />
          <EstimateInput id="clustersPerVine" label="Clusters counted per vine (in place of buds × budbreak × clusters a shoot)" text={texts.clustersPerVine} error={read.clustersPerVine.error} input={inputs.clustersPerVine} onChange={(t) => change('clustersPerVine', t)} />
          <EstimateInput
            id="lagClusterWeightG"
            label={`Weight of a cluster at lag phase (× ${formatNumber(report.crop.basis.lagPhaseMultiplier ?? 2, 2)} for harvest)`}
            unit="g"
            text={texts.lagClusterWeightG}
            error={read.lagClusterWeightG.error}
            input={inputs.lagClusterWeightG}
            onChange={(t) => change('lagClusterWeightG', t)}
          />
        </div>
        <ul className="hidden list-disc pl-5 print:block">
          <PrintedInput label="Bearing vines" value={report.crop.basis.vines} source={report.crop.basis.vinesSource} />
          <PrintedInput label="Buds kept per vine" value={read.budsPerVine.value} source={used('budsPerVine').source} />
          <PrintedInput label="Budbreak" unit="%" value={read.budbreakPercent.value} source={used('budbreakPercent').source} />
          <PrintedInput label="Clusters per shoot" value={read.clustersPerShoot.value} source={used('clustersPerShoot').source} />
          <PrintedInput label="Cluster weight" unit="g" value={read.clusterWeightG.value} source={used('clusterWeightG').source} />
          {read.clustersPerVine.value !== null && <PrintedInput label="Clusters per vine" value={read.clustersPerVine.value} source={used('clustersPerVine').source} />}
          {read.lagClusterWeightG.value !== null && <PrintedInput label="Weight of a cluster at lag phase" unit="g" value={read.lagClusterWeightG.value} source={used('lagClusterWeightG').source} />}
        </ul>
        <p className="print:hidden">
          Bearing vines: <strong>{formatCount(report.crop.basis.vines)}</strong> ({report.crop.basis.vinesSource}).
        </p>
        <div className="rounded-xl border-2 border-bark bg-panel p-4 break-inside-avoid" data-testid="crop-estimate" aria-live="polite">
          {crop.kg === null ? (
            <p className="text-lg font-bold">Enter {crop.missing.map(missingWord).join(' and ')} to estimate the crop.</p>
          ) : (
            <>
              <p className="text-2xl font-extrabold" data-testid="crop-total">
                {formatWeightKg(crop.kg, units)}
              </p>
              <p>
                {formatWeightKg(crop.kgPerVine ?? 0, units, 2)} a vine; {cropPerArea(crop, units)}
              </p>
            </>
          )}
          <How how={crop.how} from={`estimateCropKg, then ${units === 'metric' ? 'cropTonnesPerHa' : 'cropShortTonsPerAcre'} over ${formatAreaM2(report.block.areaM2, units)} of planted slots. Estimates are often 30% off; within 10% is a good one.`} />
          <p className="text-sm" data-testid="crop-rests-on">
            Rests on: {cropRestsOn(cropInputs)}.
          </p>
        </div>
        <p data-testid="crop-sampling">
          To know the mean yield a vine within ±{report.crop.sampling.marginPercent}%, weigh or count <strong>{formatCount(report.crop.sampling.vines)} vines</strong> at random: vine yields vary by{' '}
          {formatNumber(report.crop.sampling.cvPercent, 0)}% ({report.crop.sampling.cvSource}).
        </p>
        <How how={report.crop.sampling.how} />
        {report.crop.target && (
          <p data-testid="crop-target">
            The vines&apos; size ({formatWeightKg(report.crop.target.pruningKgPerVine, units, 2)} of prunings a vine) ripens about {formatWeightKg(report.crop.target.lowKgPerVine, units, 1)}–
            {formatWeightKg(report.crop.target.highKgPerVine, units, 1)} a vine
            {report.crop.target.targetKgPerVine !== null ? `, ${formatWeightKg(report.crop.target.targetKgPerVine, units, 1)} at the balanced Ravaz index of 15` : ''} ({report.crop.target.how}; {report.crop.target.from}).
          </p>
        )}
      </Section>

      <Section id="labour" title="Pruning labour" intro="Standing vines × minutes per vine ÷ 60, at the crew's hourly cost. Cane pruning is the slower, costlier kind: canes are pulled from the wires and new ones tied down.">
        <div className="grid gap-4 sm:grid-cols-2 print:hidden" data-testid="labour-inputs">
          <EstimateInput id="minutesPerVine" label="Minutes per vine" unit="min" text={texts.minutesPerVine} error={read.minutesPerVine.error} input={inputs.minutesPerVine} onChange={(t) => change('minutesPerVine', t)} />
          <EstimateInput id="hourlyCost" label="Hourly cost" unit="per hour" text={texts.hourlyCost} error={read.hourlyCost.error} input={inputs.hourlyCost} onChange={(t) => change('hourlyCost', t)} />
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
                {formatNumber(labour.hours, 0)} hours, cost {money(labour.cost)}
              </p>
              <p>
                {formatCount(report.labour.basis.vines)} vines, {report.block.trainingSystem}-pruned;{' '}
                {units === 'metric' ? `${formatNumber(labour.hoursPerHa ?? 0, 0)} h/ha` : `${formatNumber(labour.hoursPerAcre ?? 0, 0)} h/acre`}.
              </p>
              {labour.alternative && (
                <p className="text-bark-soft">
                  {labour.alternative.trainingSystem === 'spur' ? 'Spur-pruned' : 'Cane-pruned'} at the default {formatNumber(labour.alternative.minutesPerVine, 2)} min a vine it would take{' '}
                  {formatNumber(labour.alternative.hours, 0)} hours ({money(labour.alternative.cost)}).
                </p>
              )}
            </>
          )}
          <How how={labour.how} from="Martinson & Vanden Heuvel (Cornell): each minute per vine is 13.5 h/acre at 807 vines/acre." />
        </div>
        {report.labour.recorded && <RecordedLabourNote recorded={report.labour.recorded} estimateHours={labour.hours} blockId={report.block.id} season={report.season} />}
      </Section>

      <Section
        id="bud-injury"
        title="Winter bud injury"
        intro={
          report.budInjury
            ? `Buds cut open before pruning; under ${report.budInjury.limits.extraFromPercent}% dead primaries prune as usual (Cornell NNY), from there to ${report.budInjury.limits.minimalAbovePercent}% leave that percentage more buds (Cornell NNY), over ${report.budInjury.limits.minimalAbovePercent}% prune minimally or wait until after budbreak (Purdue; Michigan State).`
            : 'Buds cut open before pruning, to adjust the bud target for winter injury.'
        }
      >
        {report.budInjury ? (
          <>
            <div className="grid gap-3 sm:grid-cols-3 print:grid-cols-3">
              <FigureCard testId="fig-bud-kill" label={report.budInjury.kill.label} value={report.budInjury.kill.text} how={report.budInjury.kill.how} from={report.budInjury.kill.from} />
              <div className="flex flex-col gap-1">
                <EstimateInput id="budTarget" label="Bud target per vine before injury" text={texts.budTarget} error={read.budTarget.error} input={inputs.budTarget} onChange={(t) => change('budTarget', t)} />
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
              />
            </div>
            <ReportTable caption="Samples by row: primaryBudKillPercent(buds cut, primaries dead) per row.">
              <thead>
                <tr>
                  <th scope="col">Row</th>
                  <th scope="col">Samples</th>
                  <th scope="col">Buds cut</th>
                  <th scope="col">Primaries dead</th>
                  <th scope="col">Dead</th>
                </tr>
              </thead>
              <tbody>
                {report.budInjury.byRow.map((r) => (
                  <tr key={r.row}>
                    <td>{r.row}</td>
                    <td>{r.samples}</td>
                    <td>{r.budsCut}</td>
                    <td>{r.primariesDead}</td>
                    <td>{formatPercent(r.killPercent)}</td>
                  </tr>
                ))}
              </tbody>
            </ReportTable>
          </>
        ) : (
          <p>No winter bud-injury samples were recorded on this block in {report.season}.</p>
        )}
      </Section>

      <TaskSection report={report} />
      <ReplantSection report={report} />
      {comparison && <CompareSection comparison={comparison} vinesPerPanel={report.block.vinesPerPanel} />}

      <Section id="method" title="How these figures are made">
        <ul className="flex max-w-3xl list-disc flex-col gap-1 pl-5 text-sm">
          <li>
            The season is {report.season}: records observed from {report.period.from.slice(0, 10)} up to {report.period.to.slice(0, 10)} (UTC). Deleted records never count; closed ones do, since this is the season&apos;s history.
          </li>
          <li>A vine is scouted when it has any record in the season; it has a problem when its worst record of that kind is at least &quot;watch&quot;.</li>
          <li>Budbreak, pruning records and bud-injury targets use each vine&apos;s latest record; canes count one per record.</li>
          <li>Intervals are Wilson score intervals at 95% (wilsonInterval); every calculation is a function of lib/viticulture, named beside its figure with the inputs it was given.</li>
          <li>The records behind this report are in the CSV export (columns described on the export page).</li>
        </ul>
      </Section>
    </article>
  );
}

function missingWord(key: string) {
  return { budsPerVine: 'the buds kept per vine', budbreakPercent: 'the budbreak', clustersPerShoot: 'the clusters per shoot', clusterWeightG: 'the cluster weight' }[key] ?? key;
}

function cropPerArea(crop: ReturnType<typeof cropEstimate>, units: UnitSystem) {
  if (units === 'metric') return crop.tonnesPerHa === null ? '' : `${formatNumber(crop.tonnesPerHa, 1)} t/ha`;
  return crop.shortTonsPerAcre === null ? '' : `${formatNumber(crop.shortTonsPerAcre, 2)} tons/acre`;
}

function BlockFacts({ report }: { report: BlockReport }) {
  const b = report.block;
  const s = report.slots;
  return (
    <p className="text-bark-soft" data-testid="block-facts">
      {b.variety}
      {b.clone ? `, clone ${b.clone}` : ''}
      {b.rootstock ? ` on ${b.rootstock}` : ''}
      {b.plantingYear ? `, planted ${b.plantingYear}` : ''}; {b.trainingSystem}-pruned; rows {formatLengthM(b.rowSpacingM, report.units)} apart, vines{' '}
      {formatLengthM(b.vineSpacingM, report.units)}; {formatCount(b.rowCount)} rows, {formatCount(s.total)} slots ({formatAreaM2(b.areaM2, report.units)}):{' '}
      {formatCount(s.planted)} planted, {formatCount(s.replant)} replants, {formatCount(s.missing)} missing, {formatCount(s.dead)} dead.
    </p>
  );
}

function IncidenceSection({ report }: { report: BlockReport }) {
  const { kinds, rows } = report.incidence;
  const top = kinds.filter((k) => k.base === 'vines-scouted').sort((a, b) => b.vinesAffected - a.vinesAffected).slice(0, 3);
  const rowData = rows.map((r) => Object.fromEntries([['row', r.row], ...top.map((k) => [k.kind, r.kinds[k.kind]?.affected ?? 0])]));
  const problemRows = rows.filter((r) => Object.values(r.kinds).some((k) => k.affected > 0));
  const slotsBased = kinds.some((k) => k.base === 'slots');
  return (
    <Section
      id="incidence"
      title="Incidence by problem"
      intro={
        <>
          Share of the {formatCount(report.scouting.vinesScouted)} vines scouted in {report.season} whose worst record of the kind is at least &quot;watch&quot;, with its 95%
          Wilson interval{slotsBased ? `; missing or dead vines are a share of the block's ${formatCount(report.incidence.slots)} slots` : ''}. Scouts record what they find,
          so a row where only problems were written down shows a high share of few vines: read the interval and the count beside it.
        </>
      }
    >
      {kinds.length === 0 ? (
        <p>Nothing was recorded on this block in {report.season}.</p>
      ) : (
        <>
          <ChartFrame
            title="Incidence by problem"
            summary={kinds.map((k) => `${k.label} ${formatShare(k.incidence.estimate)}`).join('; ')}
            height={Math.max(160, 44 * kinds.length + 40)}
          >
            <IncidenceChart
              data={kinds.map((k) => ({
                label: k.label,
                percent: k.incidence.estimate * 100,
                error: [(k.incidence.estimate - k.incidence.lower) * 100, (k.incidence.upper - k.incidence.estimate) * 100],
              }))}
            />
          </ChartFrame>
          <ReportTable testId="incidence-table" caption="wilsonInterval(vines with the problem, out of, 0.95) for each kind.">
            <thead>
              <tr>
                <th scope="col">Problem</th>
                <th scope="col">Vines with it</th>
                <th scope="col">Out of</th>
                <th scope="col">Incidence (95% CI)</th>
                <th scope="col">Records</th>
              </tr>
            </thead>
            <tbody>
              {kinds.map((k) => (
                <tr key={k.kind} data-kind={k.kind}>
                  <th scope="row">{k.label}</th>
                  <td>{formatCount(k.vinesAffected)}</td>
                  <td>
                    {formatCount(k.outOf)} {k.base === 'slots' ? 'slots' : 'vines scouted'}
                  </td>
                  <td data-testid={`incidence-${k.kind}`}>{formatInterval(k.incidence)}</td>
                  <td>{formatCount(k.observations)}</td>
                </tr>
              ))}
            </tbody>
          </ReportTable>
          {rows.length > 1 && top.length > 0 && (
            <ChartFrame
              title={`Vines with a problem, row by row: ${top.map((k) => k.label.toLowerCase()).join(', ')}`}
              summary={`Counts of vines with each of the three commonest problems across ${rows.length} scouted rows.`}
            >
              <RowCountChart data={rowData} series={top.map((k) => ({ key: k.kind, label: k.label }))} />
            </ChartFrame>
          )}
          <ReportTable
            testId="row-incidence-table"
            caption={`Rows with a problem (${problemRows.length} of ${rows.length} rows): vines with it, share of the row's vines scouted${slotsBased ? ' (of its slots for missing or dead vines)' : ''} and 95% Wilson interval.`}
          >
            <thead>
              <tr>
                <th scope="col">Row</th>
                <th scope="col">Scouted</th>
                {kinds.map((k) => (
                  <th key={k.kind} scope="col">
                    {k.label}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {problemRows.map((r) => (
                <tr key={r.row} data-row={r.row} className={holesOnly(r) ? 'print:hidden' : undefined}>
                  <th scope="row">{r.row}</th>
                  <td>
                    {r.vinesScouted}
                    <span className="text-bark-faint"> / {r.slots}</span>
                  </td>
                  {kinds.map((k) => {
                    const cell = r.kinds[k.kind];
                    return (
                      <td key={k.kind} className="whitespace-nowrap">
                        {cell && cell.affected > 0 ? `${cell.affected} · ${formatShare(cell.incidence.estimate, 0)} (${formatShare(cell.incidence.lower, 0)}–${formatShare(cell.incidence.upper, 0)})` : '–'}
                      </td>
                    );
                  })}
                </tr>
              ))}
            </tbody>
          </ReportTable>
          {problemRows.some(holesOnly) && (
            <p className="hidden text-sm print:block">Rows whose only finding is missing or dead vines are left off paper; they are on screen and under Vines to replant.</p>
          )}
        </>
      )}
    </Section>
  );
}

const holesOnly = (r: BlockReport['incidence']['rows'][number]) => Object.entries(r.kinds).every(([kind, k]) => kind === 'missing-vine' || k.affected === 0);

function BudbreakSection({ report }: { report: BlockReport }) {
  const b = report.budbreak;
  return (
    <Section id="budbreak" title="Budbreak" intro="Shoots that pushed from the buds left at pruning, each vine's latest spring check.">
      {!b ? (
        <p>No budbreak checks were recorded on this block in {report.season}.</p>
      ) : (
        <>
          <div className="grid gap-3 sm:grid-cols-2 print:grid-cols-2">
            <FigureCard testId="fig-budbreak" label={b.pooled.label} value={b.pooled.text} how={b.pooled.how} from={b.pooled.from} />
            <FigureCard label={b.weakFigure.label} value={b.weakFigure.text} how={b.weakFigure.how} from={b.weakFigure.from} />
          </div>
          <ChartFrame title="Vines by budbreak" summary={b.histogram.map((h) => `${h.label}: ${h.count} vines`).join('; ')}>
            <HistogramChart
              data={b.histogram.map((h) => ({ label: h.label, count: h.count, below: h.to <= b.weakBelowPercent }))}
              xLabel="Buds that pushed"
              yLabel="Vines"
              threshold={{ at: b.histogram.find((h) => h.from <= b.weakBelowPercent && b.weakBelowPercent < h.to)?.label ?? '', label: `weak under ${b.weakBelowPercent}%` }}
            />
          </ChartFrame>
        </>
      )}
    </Section>
  );
}

function CaneSection({ report }: { report: BlockReport }) {
  const c = report.canes;
  return (
    <Section id="canes" title="Canes" intro="Base diameters measured at pruning and on the post-harvest walk, judged against the fruit-cane rules.">
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
            <FigureCard testId="fig-shade" label={c.shadeFigure.label} value={c.shadeFigure.text} how={c.shadeFigure.how} from={c.shadeFigure.from} />
            <FigureCard
              label="Fruit canes"
              value={c.assessed ? formatShare(c.verdicts['fruit-cane'] / c.assessed) : '–'}
              how={c.how}
              from={`${c.verdicts['fruit-cane']} fruit canes, ${c.verdicts['if-nothing-better']} if nothing better, ${c.verdicts.remove} to remove`}
            />
          </div>
          {c.histogram.length > 0 && (
            <ChartFrame title="Canes by base diameter (mm)" summary={c.histogram.map((h) => `${h.label} mm: ${h.count}`).join('; ')}>
              <HistogramChart data={c.histogram.map((h) => ({ label: h.label, count: h.count }))} xLabel="Base diameter, mm" yLabel="Canes" />
            </ChartFrame>
          )}
          <ReportTable caption="Diameter bands from settings.canes (the limits assessCane uses).">
            <thead>
              <tr>
                <th scope="col">Band</th>
                <th scope="col">Canes</th>
              </tr>
            </thead>
            <tbody>
              {c.bands.map((b) => (
                <tr key={b.label}>
                  <td>{b.label}</td>
                  <td>{b.count}</td>
                </tr>
              ))}
            </tbody>
          </ReportTable>
        </>
      )}
    </Section>
  );
}

function BudLoadSection({ report }: { report: BlockReport }) {
  const l = report.budLoad;
  const pathname = usePathname();
  const search = useSearchParams();
  const furthest = l ? [...l.vines].filter((v) => v.deviationPercent !== null).sort((a, b) => Math.abs(b.deviationPercent!) - Math.abs(a.deviationPercent!)).slice(0, 15) : [];
  return (
    <Section id="bud-load" title="Bud load and balanced pruning" intro="Buds kept on each recorded vine against the balanced-pruning target from its prunings' weight: next winter's starting point for each block.">
      {!l ? (
        <p>No pruning records were made on this block in {report.season}.</p>
      ) : (
        <>
          <div className="grid gap-3 sm:grid-cols-2 print:grid-cols-2">
            <FigureCard testId="fig-buds-kept" label={l.meanKept.label} value={l.meanKept.text} how={l.meanKept.how} from={l.meanKept.from} />
            {l.meanTarget ? (
              <FigureCard testId="fig-bud-target" label={l.meanTarget.label} value={l.meanTarget.text} how={l.meanTarget.how} from={l.meanTarget.from} />
            ) : (
              <FigureCard label="Balanced-pruning target" value="no weights" from="Weigh prunings on sample vines (pruning record or a pruning weight entry) to get a target." />
            )}
          </div>
          <form className="flex flex-wrap items-end gap-2 print:hidden" action={pathname}>
            {[...search.entries()].filter(([k]) => k !== 'grapeType').map(([k, v]) => (
              <input key={k} type="hidden" name={k} value={v} />
            ))}
            <label className="flex flex-col gap-1 font-bold">
              Balanced-pruning formula
              <select name="grapeType" defaultValue={l.formula.grapeType ?? ''} className="min-h-touch rounded-lg border-2 border-line bg-panel px-3">
                {Object.entries(GRAPE_TYPE_WORDS).map(([value, words]) => (
                  <option key={value} value={value}>
                    {words}
                  </option>
                ))}
              </select>
            </label>
            <button type="submit" className="min-h-touch rounded-lg border-2 border-rootstock px-4 font-bold text-rootstock">
              Apply
            </button>
          </form>
          <p className="text-sm">
            Formula: {l.formula.firstUnitBuds} buds for the first {l.formula.unit} of prunings + {l.formula.perAdditionalUnitBuds} per further {l.formula.unit}
            {l.formula.grapeType ? ` (${GRAPE_TYPE_WORDS[l.formula.grapeType]})` : ''}. {l.under} vines were left more than 10% under target and {l.over} more than 10% over.
          </p>
          <p className="text-sm" data-testid="bud-density">
            {formatNumber(l.density.kept.budsPerFt)} buds kept per foot of row ({formatNumber(l.density.kept.budsPerM)} per metre)
            {l.density.target ? `; the target is ${formatNumber(l.density.target.budsPerFt)} per foot` : ''}. Ohio State&apos;s range is {l.density.kept.rangePerVine.min}–{l.density.kept.rangePerVine.max} buds a vine at this spacing.
          </p>
          {l.density.warning && (
            <p role="alert" data-testid="bud-density-warning" className="rounded-lg border-2 border-alarm bg-panel p-3 font-bold">
              {l.density.warning}
            </p>
          )}
          <ReportTable caption={`Vines with a target, by how far the buds kept were off it: ${l.how}.`}>
            <thead>
              <tr>
                <th scope="col">Off target</th>
                <th scope="col">Vines</th>
              </tr>
            </thead>
            <tbody>
              {l.bands.map((b) => (
                <tr key={b.label}>
                  <td>{b.label}</td>
                  <td>{b.vines}</td>
                </tr>
              ))}
            </tbody>
          </ReportTable>
          {furthest.length > 0 && (
            <ReportTable caption="The vines furthest off their target (all of them are in the CSV export).">
              <thead>
                <tr>
                  <th scope="col">Vine</th>
                  <th scope="col">Buds kept</th>
                  <th scope="col">Prunings</th>
                  <th scope="col">Target</th>
                  <th scope="col">Off by</th>
                </tr>
              </thead>
              <tbody>
                {furthest.map((v) => (
                  <tr key={`${v.row}:${v.position}`}>
                    <td>{vineAddress(v.row, v.position, report.block.vinesPerPanel)}</td>
                    <td>{v.kept}</td>
                    <td>{v.weightKg === null ? '–' : `${formatWeightKg(v.weightKg, report.units, 2)}${v.weightSource === 'row-sample' ? ' (row sample)' : ''}`}</td>
                    <td>{v.target ?? '–'}</td>
                    <td>{v.deviationPercent === null ? '–' : `${v.deviationPercent > 0 ? '+' : ''}${formatNumber(v.deviationPercent, 0)}%`}</td>
                  </tr>
                ))}
              </tbody>
            </ReportTable>
          )}
        </>
      )}
    </Section>
  );
}

const GRAPE_TYPE_WORDS: Record<string, string> = {
  vinifera: 'Vinifera, 20 + 20',
  concord: 'Concord, 30 + 10',
  american: 'American, 30 + 10',
  niagara: 'Niagara, 25 + 10',
  catawba: 'Catawba, 30 + 10',
  delaware: 'Delaware, 20 + 10',
  'french-hybrid': 'French hybrids, 20 + 10',
  'hybrid-small-cluster': 'Small-cluster hybrids, 20 + 10',
  'hybrid-large-cluster': 'Large-cluster hybrids, 10 + 10',
  'new-hybrid': 'New hybrids, 20 + 20',
  'seedless-table': 'Seedless table grapes, 30 + 10',
};

function BalanceSection({ report }: { report: BlockReport }) {
  const r = report.ravaz;
  const h = report.harvest;
  return (
    <Section id="balance" title="Harvest and vine balance" intro="Fruit weighed at harvest against the one-year wood weighed at the next winter's pruning (Ravaz index).">
      {h ? (
        <div className="grid gap-3 sm:grid-cols-2 print:grid-cols-2">
          <FigureCard testId="fig-harvest" label={h.kgPerVine.label} value={h.kgPerVine.text} how={h.kgPerVine.how} from={h.kgPerVine.from} />
          {h.clusterWeightG && <FigureCard label={h.clusterWeightG.label} value={h.clusterWeightG.text} how={h.clusterWeightG.how} from={h.clusterWeightG.from} />}
        </div>
      ) : (
        <p>No yields were entered for the {report.season} harvest.</p>
      )}
      <p className="text-sm">{report.ravazNote}</p>
      {r && (
        <>
          <div className="grid gap-3 sm:grid-cols-2 print:grid-cols-2">
            <FigureCard label={r.index.label} value={`${r.index.text}: ${RAVAZ_WORDS[r.reading]}`} how={r.index.how} from={r.index.from} />
            <FigureCard
              label="Vines or samples by reading"
              value={`${r.readings.balanced} balanced`}
              from={`${r.readings['under-cropped']} under-cropped (index under ${r.range.underBelow}), ${r.readings['over-cropped']} over-cropped (over ${r.range.overAbove}): range for ${r.rangeSource}`}
            />
          </div>
          <ReportTable caption={`${r.note} ravazIndex(yield per vine, pruning weight per vine) per vine or row sample.`}>
            <thead>
              <tr>
                <th scope="col">Vine or sample</th>
                <th scope="col">Yield a vine</th>
                <th scope="col">Prunings a vine</th>
                <th scope="col">Ravaz</th>
                <th scope="col">Reading</th>
              </tr>
            </thead>
            <tbody>
              {r.units.slice(0, 30).map((u, i) => (
                <tr key={`${u.row}:${u.position}`} className={i >= PRINTED_ROWS ? 'print:hidden' : undefined}>
                  <td>{u.position === null ? `Row ${u.row}, ${u.vines} vines` : vineAddress(u.row, u.position, report.block.vinesPerPanel)}</td>
                  <td>{formatWeightKg(u.yieldKgPerVine, report.units, 2)}</td>
                  <td>{formatWeightKg(u.pruningKgPerVine, report.units, 2)}</td>
                  <td>{formatNumber(u.index)}</td>
                  <td>{u.reading}</td>
                </tr>
              ))}
            </tbody>
          </ReportTable>
          {r.units.length > 30 && <p className="text-sm text-bark-soft print:hidden">The first 30 of {r.units.length} vines or samples, by row.</p>}
          {r.units.length > PRINTED_ROWS && <p className="hidden text-sm print:block">The first {PRINTED_ROWS} of {r.units.length} vines or samples, by row; all of them on screen.</p>}
        </>
      )}
    </Section>
  );
}

function TaskSection({ report }: { report: BlockReport }) {
  const t = report.tasks;
  return (
    <Section id="tasks" title="Tasks">
      {!t.available ? (
        <p>Tasks are not set up on this server yet.</p>
      ) : t.list.length === 0 ? (
        <p>No tasks on this block belong to {report.season}.</p>
      ) : (
        <ReportTable testId="tasks-table" caption={`${t.open} open, ${t.done} done${t.cancelled ? `, ${t.cancelled} cancelled` : ''}: tasks made or closed in ${report.season}, and those still open.`}>
          <thead>
            <tr>
              <th scope="col">Task</th>
              <th scope="col">Status</th>
              <th scope="col">Assigned to</th>
              <th scope="col">Due</th>
              <th scope="col">Vines done</th>
            </tr>
          </thead>
          <tbody>
            {t.list.map((task) => (
              <tr key={task.id}>
                <td>{task.title}</td>
                <td>{task.status}</td>
                <td>{task.assignee ?? '–'}</td>
                <td>{task.dueOn ?? '–'}</td>
                <td>
                  {task.itemsDone} of {task.items}
                </td>
              </tr>
            ))}
          </tbody>
        </ReportTable>
      )}
    </Section>
  );
}

function ReplantSection({ report }: { report: BlockReport }) {
  const r = report.replant;
  return (
    <Section id="replant" title="Vines to replant" intro={`For the nursery order: ${r.how}.`}>
      {r.total === 0 ? (
        <p>No slot on this block needs a new vine.</p>
      ) : (
        <>
          <StockTable
            testId="replant-table"
            rows={r.byStock}
            caption={`${formatCount(r.total)} vines: ${r.reasons.missing} slots marked missing, ${r.reasons.dead} dead, ${r.reasons['recorded-missing'] + r.reasons['recorded-dead']} recorded missing or dead this season, ${r.reasons.flagged} flagged for replanting.`}
          />
          <details className="print:hidden">
            <summary className="min-h-touch cursor-pointer py-2 font-bold">Slots by row ({r.byRow.length} rows)</summary>
            <ul className="columns-1 text-sm sm:columns-2">
              {r.byRow.map((row) => (
                <li key={row.row}>
                  Row {row.row}: {row.positions.join(', ')}
                </li>
              ))}
            </ul>
          </details>
        </>
      )}
    </Section>
  );
}

function CompareSection({ comparison, vinesPerPanel }: { comparison: NonNullable<BlockReportResponse['comparison']>; vinesPerPanel: number | null }) {
  const c = comparison;
  return (
    <Section id="compare" title={`${c.previous} and ${c.season} side by side`} intro="The same figures for both seasons, each read from its own season's records.">
      <ReportTable testId="compare-table" caption="Each season's figure as computed above for that season.">
        <thead>
          <tr>
            <th scope="col">Figure</th>
            <th scope="col">{c.previous}</th>
            <th scope="col">{c.season}</th>
          </tr>
        </thead>
        <tbody>
          {c.rows.map((row) => (
            <tr key={row.label}>
              <td>{row.label}</td>
              <td>{row.beforeText}</td>
              <td>{row.nowText}</td>
            </tr>
          ))}
        </tbody>
      </ReportTable>
      {c.kinds.length > 0 && (
        <ChartFrame
          title={`Incidence by problem, ${c.previous} (hatched) and ${c.season} (solid)`}
          summary={c.kinds.map((k) => `${k.label}: ${k.before === null ? 'none' : formatShare(k.before)} then ${k.now === null ? 'none' : formatShare(k.now)}`).join('; ')}
          height={Math.max(180, 56 * c.kinds.length + 60)}
        >
          <CompareChart
            data={c.kinds.map((k) => ({ label: k.label, before: k.before === null ? null : k.before * 100, now: k.now === null ? null : k.now * 100 }))}
            before={String(c.previous)}
            now={String(c.season)}
          />
        </ChartFrame>
      )}
      <h3 className="text-xl font-bold">Vines whose problems persisted</h3>
      {c.persisted.total === 0 ? (
        <p>No vine had the same problem in both seasons.</p>
      ) : (
        <>
          <p data-testid="persisted-summary">
            {formatCount(c.persisted.total)} vine problems were at &quot;watch&quot; or worse in both {c.previous} and {c.season}:{' '}
            {c.persisted.byKind.map((k) => `${k.label.toLowerCase()} ${formatCount(k.vines)}`).join(', ')}.
          </p>
          <ReportTable
            testId="persisted-table"
            caption={`The ${c.persisted.shown === c.persisted.total ? '' : `${c.persisted.shown} `}worst of them now, worst first. Severity: 1 watch, 2 act this season, 3 act now.`}
          >
            <thead>
              <tr>
                <th scope="col">Vine</th>
                <th scope="col">Problem</th>
                <th scope="col">{c.previous}</th>
                <th scope="col">{c.season}</th>
              </tr>
            </thead>
            <tbody>
              {c.persisted.vines.map((v, i) => (
                <tr key={`${v.row}:${v.position}:${v.kind}`} className={i >= PRINTED_ROWS ? 'print:hidden' : undefined}>
                  <td>{vineAddress(v.row, v.position, vinesPerPanel)}</td>
                  <td>{kindLabel(v.kind)}</td>
                  <td>{v.before}</td>
                  <td>
                    {v.now}
                    {v.now > v.before ? ' (worse)' : v.now < v.before ? ' (better)' : ''}
                  </td>
                </tr>
              ))}
            </tbody>
          </ReportTable>
          {c.persisted.shown > PRINTED_ROWS && <p className="hidden text-sm print:block">The worst {PRINTED_ROWS} printed; {c.persisted.shown} on screen.</p>}
        </>
      )}
    </Section>
  );
}
