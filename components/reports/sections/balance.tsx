import { vineAddress } from '@/lib/grid/labels';
import type { BlockReport } from '@/lib/reports/block-report';
import { RAVAZ_WORDS } from '@/lib/reports/block/balance';
import { formatNumber, formatWeightKg } from '@/lib/reports/format';
import { FigureCard, ListTable, ReportFigure, Section } from '../figure';
import { PRINTED_ROWS } from './words';

export function BalanceSection({ report, title }: { report: BlockReport; title: string }) {
  const r = report.ravaz;
  const h = report.harvest;
  return (
    <Section id="balance" title={title} intro="Fruit weighed at harvest against the one-year wood weighed at the next winter's pruning (the Ravaz index).">
      {h ? (
        <div className="grid gap-3 sm:grid-cols-2 print:grid-cols-2">
          <ReportFigure testId="fig-harvest" figure={h.kgPerVine} />
          {h.clusterWeightG && <ReportFigure figure={h.clusterWeightG} />}
        </div>
      ) : (
        <p>No yields were entered for the {report.season} harvest.</p>
      )}
      <p className="text-sm">{report.ravazNote}</p>
      {r && (
        <>
          <div className="grid gap-3 sm:grid-cols-2 print:grid-cols-2">
            <ReportFigure figure={r.index} value={`${r.index.text}: ${RAVAZ_WORDS[r.reading]}`} />
            <FigureCard
              label="Vines or samples by reading"
              value={`${r.readings.balanced} balanced`}
              from={`${r.readings['under-cropped']} under-cropped (index under ${r.range.underBelow}), ${r.readings['over-cropped']} over-cropped (over ${r.range.overAbove}): range for ${r.rangeSource}`}
            />
          </div>
          <ListTable
            caption={`${r.note} Each vine or row sample: its yield a vine ÷ its prunings a vine.`}
            columns={['Vine or sample', 'Yield a vine', 'Prunings a vine', 'Ravaz', 'Reading']}
            printedRows={PRINTED_ROWS}
            rows={r.units.slice(0, 30).map((u) => ({
              key: `${u.row}:${u.position}`,
              cells: [
                u.position === null ? `Row ${u.row}, ${u.vines} vines` : vineAddress(u.row, u.position, report.block.vinesPerPanel),
                formatWeightKg(u.yieldKgPerVine, report.units, 2),
                formatWeightKg(u.pruningKgPerVine, report.units, 2),
                formatNumber(u.index),
                u.reading,
              ],
            }))}
          />
          {r.units.length > 30 && <p className="text-sm text-bark-soft print:hidden">The first 30 of {r.units.length} vines or samples, by row.</p>}
          {r.units.length > PRINTED_ROWS && (
            <p className="hidden text-sm print:block">
              The first {PRINTED_ROWS} of {r.units.length} vines or samples, by row; all of them on screen.
            </p>
          )}
        </>
      )}
    </Section>
  );
}
