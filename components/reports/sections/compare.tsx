import { vineAddress } from '@/lib/grid/labels';
import { kindLabel } from '@/lib/labels';
import type { BlockReportResponse } from '@/lib/reports/api';
import { formatCount, formatShare } from '@/lib/reports/format';
import { ChartFrame, CompareChart } from '../charts';
import { ListTable, ReportTable, Section } from '../figure';
import { PRINTED_ROWS } from './words';

export function CompareSection({
  comparison: c,
  vinesPerPanel,
  title,
}: {
  comparison: NonNullable<BlockReportResponse['comparison']>;
  vinesPerPanel: number | null;
  title: string;
}) {
  return (
    <Section id="compare" title={title} intro="The same figures for both seasons, each read from its own season's records.">
      <ListTable
        testId="compare-table"
        caption="Each season's figure as worked out above for that season."
        columns={['Figure', String(c.previous), String(c.season)]}
        rows={c.rows.map((row) => ({ key: row.label, cells: [row.label, row.beforeText, row.nowText] }))}
      />
      {c.kinds.length > 0 && (
        <ChartFrame
          title={`Incidence by problem, ${c.previous} (hatched) and ${c.season} (solid)`}
          summary={c.kinds
            .map((k) => `${k.label}: ${k.before === null ? 'none' : formatShare(k.before)} then ${k.now === null ? 'none' : formatShare(k.now)}`)
            .join('; ')}
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
          {c.persisted.shown > PRINTED_ROWS && (
            <p className="hidden text-sm print:block">
              The worst {PRINTED_ROWS} printed; {c.persisted.shown} on screen.
            </p>
          )}
        </>
      )}
    </Section>
  );
}
