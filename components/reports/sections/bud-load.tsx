'use client';

import { usePathname, useSearchParams } from 'next/navigation';
import { vineAddress } from '@/lib/grid/labels';
import type { BlockReport } from '@/lib/reports/block-report';
import { formulaWords } from '@/lib/reports/block/bud-load';
import { formatCount, formatNumber, formatWeightKg } from '@/lib/reports/format';
import { FigureCard, ListTable, ReportFigure, Section, Working } from '../figure';

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

export function BudLoadSection({ report, title }: { report: BlockReport; title: string }) {
  const l = report.budLoad;
  const pathname = usePathname();
  const search = useSearchParams();
  const furthest = l
    ? [...l.vines]
        .filter((v) => v.deviationPercent !== null)
        .sort((a, b) => Math.abs(b.deviationPercent!) - Math.abs(a.deviationPercent!))
        .slice(0, 15)
    : [];
  return (
    <Section
      id="bud-load"
      title={title}
      intro="What the pruners kept on each recorded vine (canes, the buds on them, renewal spurs) against the balanced-pruning target from its prunings' weight: next winter's starting point. These are records of the work, not problems."
    >
      {!l ? (
        <p>No pruning records were made on this block in {report.season}.</p>
      ) : (
        <>
          <div className="grid gap-3 sm:grid-cols-2 print:grid-cols-2">
            <ReportFigure testId="fig-buds-kept" figure={l.meanKept} />
            {l.meanTarget ? (
              <ReportFigure testId="fig-bud-target" figure={l.meanTarget} />
            ) : (
              <FigureCard
                label="Balanced-pruning target"
                value="no weights"
                from="Weigh prunings on sample vines (pruning record or a pruning weight entry) to get a target."
              />
            )}
          </div>
          <p data-testid="kept-on-vines">
            Kept on a vine, on average: <strong>{formatNumber(l.kept.canes)} canes</strong> of {formatNumber(l.kept.budsPerCane)} buds each and{' '}
            <strong>{formatNumber(l.kept.renewalSpurs)} renewal spurs</strong> of {l.kept.budsPerRenewalSpur} buds, over {formatCount(l.vinesRecorded)} vines
            recorded.{' '}
            {l.withTarget > 0 && (
              <>
                Of the {formatCount(l.withTarget)} vines with a target, {formatCount(l.bands[0]!.vines)} were left {l.bands[0]!.label.toLowerCase()},{' '}
                {formatCount(l.under)} had too few buds and {formatCount(l.over)} too many.
              </>
            )}
          </p>
          <form className="flex flex-wrap items-end gap-2 print:hidden" action={pathname}>
            {[...search.entries()]
              .filter(([k]) => k !== 'grapeType')
              .map(([k, v]) => (
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
            Formula: {formulaWords(l.formula)}
            {l.formula.grapeType ? ` (${GRAPE_TYPE_WORDS[l.formula.grapeType]})` : ''}.
          </p>
          <p className="text-sm" data-testid="bud-density">
            {formatNumber(l.density.kept.budsPerFt)} buds kept per foot of row ({formatNumber(l.density.kept.budsPerM)} per metre)
            {l.density.target ? `; the target is ${formatNumber(l.density.target.budsPerFt)} per foot` : ''}. Ohio State&apos;s range is{' '}
            {l.density.kept.rangePerVine.min}–{l.density.kept.rangePerVine.max} buds a vine at this spacing.
          </p>
          <Working how={l.density.how} source={l.density.source} />
          {l.density.warning && (
            <p role="alert" data-testid="bud-density-warning" className="rounded-lg border-2 border-alarm bg-panel p-3 font-bold">
              {l.density.warning}
            </p>
          )}
          <ListTable
            caption="Vines with a target, by how far the buds kept were off it."
            columns={['Off target', 'Vines']}
            rows={l.bands.map((b) => ({ key: b.label, cells: [b.label, b.vines] }))}
          />
          <Working how={l.how} source={l.source} />
          {furthest.length > 0 && (
            <ListTable
              caption="The vines furthest off their target (all of them are in the CSV export)."
              columns={['Vine', 'Kept', 'Buds kept', 'Prunings', 'Target', 'Off by']}
              rows={furthest.map((v) => ({
                key: `${v.row}:${v.position}`,
                cells: [
                  vineAddress(v.row, v.position, report.block.vinesPerPanel),
                  `${v.canesKept} × ${v.budsPerCane}, ${v.renewalSpurs} spurs`,
                  v.kept,
                  v.weightKg === null ? '–' : `${formatWeightKg(v.weightKg, report.units, 2)}${v.weightSource === 'row-sample' ? ' (row sample)' : ''}`,
                  v.target ?? '–',
                  v.deviationPercent === null ? '–' : `${v.deviationPercent > 0 ? '+' : ''}${formatNumber(v.deviationPercent, 0)}%`,
                ],
              }))}
            />
          )}
        </>
      )}
    </Section>
  );
}
