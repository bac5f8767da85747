'use client';

import { CellSwatch } from '@/components/grid/cell-swatch';
import { encodeCell } from '@/lib/grid/cells';
import { kindLabel, SEVERITY_LABELS } from '@/lib/grid/labels';
import type { GridSummary as Summary } from '@/lib/grid/summary';
import { formatCount } from '@/lib/units';
import type { Severity } from '@/lib/viticulture';

const percent = (p: number) => `${(p * 100).toFixed(p > 0 && p < 0.1 ? 1 : 0)}%`;

interface GridSummaryProps {
  summary: Summary;
  onGoToRow: (row: number) => void;
}

/** The figures beside the grid. Incidence is among vines scouted in the period, with a 95% Wilson interval. */
export function GridSummary({ summary, onGoToRow }: GridSummaryProps) {
  const levels: [Severity, number][] = [
    [3, summary.byLevel.urgent],
    [2, summary.byLevel.act],
    [1, summary.byLevel.watch],
  ];
  return (
    <section aria-labelledby="summary-heading" className="flex flex-col gap-4 rounded-xl border-2 border-line bg-panel p-4">
      <h2 id="summary-heading" className="text-xl font-bold">
        Summary
      </h2>
      <ul className="grid grid-cols-3 gap-2" aria-label="Vines by worst finding">
        {levels.map(([severity, count]) => (
          <li key={severity} className="flex flex-col items-start gap-1 rounded-lg bg-ground p-2">
            <span className="flex items-center gap-2">
              <CellSwatch code={encodeCell('planted', severity)} size={22} />
              <span className="text-2xl font-extrabold" data-testid={`vines-severity-${severity}`}>
                {formatCount(count)}
              </span>
            </span>
            <span className="text-sm leading-tight">{SEVERITY_LABELS[severity]}</span>
          </li>
        ))}
      </ul>
      <p className="text-sm text-bark-soft">
        {formatCount(summary.vinesScouted)} vines scouted in this period · {summary.slots.missing} missing, {summary.slots.dead} dead, {summary.slots.replant}{' '}
        replants in the block
      </p>

      {summary.worstRows.length > 0 && (
        <div>
          <h3 className="mb-1 font-bold">Rows with the most problem vines</h3>
          <ol className="flex flex-col gap-1">
            {summary.worstRows.map((r) => (
              <li key={r.row}>
                <button
                  type="button"
                  className="flex min-h-touch w-full items-center justify-between gap-2 rounded-lg px-2 text-left hover:bg-rootstock-tint"
                  onClick={() => onGoToRow(r.row)}
                >
                  <span className="font-bold">Row {r.row}</span>
                  <span>
                    {r.problems} vine{r.problems === 1 ? '' : 's'}
                    {r.urgent ? `, ${r.urgent} act now` : ''}
                  </span>
                </button>
              </li>
            ))}
          </ol>
        </div>
      )}

      <div>
        <h3 className="mb-1 font-bold">Findings by kind</h3>
        {summary.kinds.length === 0 ? (
          <p>No findings match these filters.</p>
        ) : (
          <div className="overflow-x-auto" role="region" aria-label="Findings by kind" tabIndex={0}>
            <table className="w-full border-collapse text-left text-sm" data-testid="grid-findings-table">
              <caption className="sr-only">Findings by kind: counts by severity and incidence among vines scouted</caption>
              <thead>
                <tr className="border-b-2 border-line">
                  <th scope="col" className="py-1 pr-2">
                    Kind
                  </th>
                  <th scope="col" className="px-1 text-right" title="Fine">
                    <span className="sr-only">Fine</span>
                    <span aria-hidden="true">0</span>
                  </th>
                  <th scope="col" className="px-1 text-right" title="Watch">
                    <span className="sr-only">Watch</span>
                    <span aria-hidden="true">1</span>
                  </th>
                  <th scope="col" className="px-1 text-right" title="Act this season">
                    <span className="sr-only">Act this season</span>
                    <span aria-hidden="true">2</span>
                  </th>
                  <th scope="col" className="px-1 text-right" title="Act now">
                    <span className="sr-only">Act now</span>
                    <span aria-hidden="true">3</span>
                  </th>
                  <th scope="col" className="pl-2 text-right">
                    Incidence
                  </th>
                </tr>
              </thead>
              <tbody>
                {summary.kinds.map((k) => (
                  <tr key={k.kind} className="border-b border-line align-top">
                    <th scope="row" className="py-1 pr-2 font-bold">
                      {kindLabel(k.kind)}
                    </th>
                    {k.bySeverity.map((n, i) => (
                      <td key={i} className="px-1 text-right tabular-nums">
                        {formatCount(n)}
                      </td>
                    ))}
                    <td className="pl-2 text-right tabular-nums">
                      {k.incidence ? (
                        <>
                          <span className="font-bold">{percent(k.incidence.estimate)}</span>
                          <span className="block text-xs text-bark-soft">
                            {percent(k.incidence.lower)}–{percent(k.incidence.upper)}
                          </span>
                        </>
                      ) : (
                        '—'
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        <p className="mt-2 text-xs text-bark-soft">
          Columns 0–3 count findings by severity (fine, watch, act this season, act now). Incidence: vines with a finding of that kind at watch or worse, out of
          the vines scouted in this period (missing or dead vines: out of every slot), with its 95% interval (Wilson). Pruning records and checks are not
          findings and have no incidence.
        </p>
      </div>

      {summary.records.length > 0 && (
        <div>
          <h3 className="mb-1 font-bold">Records of the work</h3>
          <div className="overflow-x-auto" role="region" aria-label="Records of the work" tabIndex={0}>
            <table className="w-full border-collapse text-left text-sm" data-testid="grid-records-table">
              <caption className="sr-only">Pruning records, pruning checks and notes: how many, and how many vines were left off the bud target</caption>
              <thead>
                <tr className="border-b-2 border-line">
                  <th scope="col" className="py-1 pr-2">
                    Record
                  </th>
                  <th scope="col" className="px-1 text-right">
                    Records
                  </th>
                  <th scope="col" className="pl-2 text-right">
                    Vines off target
                  </th>
                </tr>
              </thead>
              <tbody>
                {summary.records.map((k) => (
                  <tr key={k.kind} className="border-b border-line align-top" data-kind={k.kind}>
                    <th scope="row" className="py-1 pr-2 font-bold">
                      {kindLabel(k.kind)}
                    </th>
                    <td className="px-1 text-right tabular-nums">{formatCount(k.observations)}</td>
                    <td className="pl-2 text-right tabular-nums">{k.kind === 'note' ? '—' : formatCount(k.vinesAffected)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <p className="mt-2 text-xs text-bark-soft">
            Off target: buds left more than the usual margin away from the vine&apos;s bud target (the season report gives buds kept against the target).
          </p>
        </div>
      )}
    </section>
  );
}
