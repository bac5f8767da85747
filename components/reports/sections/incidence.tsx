import type { BlockReport } from '@/lib/reports/block-report';
import { formatCount, formatInterval, formatShare } from '@/lib/reports/format';
import { ChartFrame, IncidenceChart, RowCountChart } from '../charts';
import { ReportTable, Section, Working } from '../figure';

const holesOnly = (r: BlockReport['incidence']['rows'][number]) => Object.entries(r.kinds).every(([kind, k]) => kind === 'missing-vine' || k.affected === 0);

export function IncidenceSection({ report, title }: { report: BlockReport; title: string }) {
  const { kinds, rows } = report.incidence;
  const top = kinds
    .filter((k) => k.base === 'vines-scouted')
    .sort((a, b) => b.vinesAffected - a.vinesAffected)
    .slice(0, 3);
  const rowData = rows.map((r) => Object.fromEntries([['row', r.row], ...top.map((k) => [k.kind, r.kinds[k.kind]?.affected ?? 0])]));
  const problemRows = rows.filter((r) => Object.values(r.kinds).some((k) => k.affected > 0));
  const slotsBased = kinds.some((k) => k.base === 'slots');
  return (
    <Section
      id="incidence"
      title={title}
      intro={
        <>
          Share of the {formatCount(report.scouting.vinesScouted)} vines scouted in {report.season} whose worst finding of the kind is at least
          &quot;watch&quot;, with the range it probably lies in (95%)
          {slotsBased ? `; missing or dead vines are a share of the block's ${formatCount(report.incidence.slots)} slots` : ''}. Only findings count: pruning
          records and pruning checks are reported under their own headings. Scouts record what they find, so a row where only problems were written down shows a
          high share of few vines: read the range and the count beside it.
        </>
      }
    >
      {kinds.length === 0 ? (
        <p>No findings were recorded on this block in {report.season}.</p>
      ) : (
        <>
          <ChartFrame
            title={title}
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
          <ReportTable
            testId="incidence-table"
            caption="Each problem: the vines with it at watch or worse, out of the vines scouted (or the slots), and the 95% range."
          >
            <thead>
              <tr>
                <th scope="col">Problem</th>
                <th scope="col">Vines with it</th>
                <th scope="col">Out of</th>
                <th scope="col">Incidence (95% range)</th>
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
          <Working how={kinds[0]!.how ? `For example, ${kinds[0]!.label.toLowerCase()}: ${kinds[0]!.how}.` : undefined} source={report.incidence.source} />
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
            caption={`Rows with a problem (${problemRows.length} of ${rows.length} rows): vines with it, share of the row's vines scouted${slotsBased ? ' (of its slots for missing or dead vines)' : ''} and its 95% range.`}
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
                        {cell && cell.affected > 0
                          ? `${cell.affected} · ${formatShare(cell.incidence.estimate, 0)} (${formatShare(cell.incidence.lower, 0)}–${formatShare(cell.incidence.upper, 0)})`
                          : '–'}
                      </td>
                    );
                  })}
                </tr>
              ))}
            </tbody>
          </ReportTable>
          {problemRows.some(holesOnly) && (
            <p className="hidden text-sm print:block">
              Rows whose only finding is missing or dead vines are left off paper; they are on screen and under Vines to replant.
            </p>
          )}
        </>
      )}
    </Section>
  );
}
