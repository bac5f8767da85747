import Link from 'next/link';
import { PassStrip, StripLegend } from '@/components/work/pass-strip';
import { formatCount } from '@/lib/units';
import { PAY_CAUTION, type PayBasis } from '@/lib/work/cost';
import { formatDay, formatHours, formatMoney, formatPace, overEstimate } from '@/lib/work/format';
import { PASS_LABELS } from '@/lib/work/passes';
import type { BlockProgress, PassDetail } from '@/lib/work/progress';

function payText(pay: PayBasis) {
  if (pay.basis === 'hourly') return pay.hourlyRate === null ? 'by the hour, no rate set yet' : `by the hour at ${formatMoney(pay.hourlyRate)} a person-hour`;
  return pay.pieceRatePerVine === null ? 'at a piece rate, no rate set yet' : `at a piece rate of ${formatMoney(pay.pieceRatePerVine)} a vine`;
}

function Figure({ label, value, testId }: { label: string; value: string; testId?: string }) {
  return (
    <div>
      <dt className="text-sm text-bark-soft">{label}</dt>
      <dd className="text-lg font-extrabold" data-testid={testId}>
        {value}
      </dd>
    </div>
  );
}

function PassCard({ pass, rows }: { pass: PassDetail; rows: number[] }) {
  const label = PASS_LABELS[pass.pass];
  const behind = overEstimate(pass.projectedHours, pass.estimatedHours);
  const started = pass.personHours > 0;
  return (
    <section
      className="flex flex-col gap-3 rounded-2xl border-2 border-line bg-panel p-4"
      aria-labelledby={`pass-${pass.pass}`}
      data-testid={`pass-${pass.pass}`}
    >
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id={`pass-${pass.pass}`} className="text-xl font-bold">
          {label}
        </h2>
        <p className="font-bold">
          {formatCount(pass.rowsDone)} of {formatCount(pass.rowCount)} rows · {formatCount(pass.vinesDone)} of {formatCount(pass.vineCount)} vines
        </p>
      </div>
      <PassStrip label={label} rows={rows} states={pass.rowStates} />
      {started ? (
        <>
          <dl className="grid grid-cols-2 gap-3 sm:grid-cols-4">
            <Figure label="Person-hours" value={formatHours(pass.personHours)} />
            <Figure label="Pace" value={formatPace(pass.vinesPerPersonHour)} />
            <Figure label="Projected finish" value={formatDay(pass.projectedFinish)} testId={`finish-${pass.pass}`} />
            <Figure label="Days worked" value={formatCount(pass.workDays)} />
            <Figure label="Cost to date" value={formatMoney(pass.costToDate)} />
            <Figure label="Projected cost" value={formatMoney(pass.projectedCost)} />
            <Figure label="Projected hours" value={formatHours(pass.projectedHours)} />
            {pass.estimatedHours !== null && <Figure label="Season report estimate" value={formatHours(pass.estimatedHours)} />}
          </dl>
          {behind && (
            <p className="rounded-lg border-2 border-alarm bg-alarm-tint p-2 font-bold" data-testid={`behind-${pass.pass}`}>
              Behind: at this pace the pass takes {formatHours(pass.projectedHours)}, more than the {formatHours(pass.estimatedHours)} the season report
              estimates.
            </p>
          )}
          {pass.leads.length > 0 && (
            <table className="w-full text-left text-sm">
              <caption className="mb-1 text-left font-bold">Pace per crew lead</caption>
              <thead>
                <tr className="border-b-2 border-line">
                  <th scope="col" className="py-1">
                    Crew lead
                  </th>
                  <th scope="col" className="py-1 text-right">
                    Vines
                  </th>
                  <th scope="col" className="py-1 text-right">
                    Person-hours
                  </th>
                  <th scope="col" className="py-1 text-right">
                    Vines per person-hour
                  </th>
                </tr>
              </thead>
              <tbody>
                {pass.leads.map((l) => (
                  <tr key={l.userId ?? 'gone'} className="border-b border-line">
                    <td className="py-1">{l.name ?? 'A former member'}</td>
                    <td className="py-1 text-right">{formatCount(l.vines)}</td>
                    <td className="py-1 text-right">{formatHours(l.personHours)}</td>
                    <td className="py-1 text-right">{formatPace(l.vinesPerPersonHour)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </>
      ) : (
        <p className="text-bark-soft">
          Not started this season.
          {pass.estimatedHours !== null &&
            ` The season report estimates ${formatHours(pass.estimatedHours)}${pass.projectedCost !== null ? `, about ${formatMoney(pass.projectedCost)}` : ''}.`}
        </p>
      )}
    </section>
  );
}

export function BlockProgressView({ progress, season, pay, seasons }: { progress: BlockProgress; season: number; pay: PayBasis; seasons: number[] }) {
  const { block } = progress;
  const csv = `/api/reports/row-work.csv?season=${season}&blockId=${block.id}`;
  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-bark-soft">
            <Link href={`/work?season=${season}`}>Work progress</Link> · season {season}
          </p>
          <h1 className="text-3xl font-extrabold">{block.name}</h1>
          <p>
            {formatCount(block.rows.length)} rows · {formatCount(block.vineCount)} standing vines · {block.trainingSystem}-pruned
          </p>
        </div>
        <nav aria-label="Seasons and export" className="flex flex-wrap gap-2">
          {seasons.map((s) => (
            <Link
              key={s}
              href={`/work/${block.id}?season=${s}`}
              aria-current={s === season ? 'page' : undefined}
              className="flex min-h-touch items-center rounded-lg border-2 border-line px-3 font-bold no-underline aria-[current=page]:border-rootstock"
            >
              {s}
            </Link>
          ))}
          <a href={csv} className="flex min-h-touch items-center rounded-lg border-2 border-rootstock px-3 font-bold text-rootstock no-underline">
            Export CSV
          </a>
        </nav>
      </div>
      <p className="rounded-lg border-2 border-cut bg-cut-tint p-3 text-sm">
        Costed {payText(pay)} (<Link href="/settings">settings</Link>). {PAY_CAUTION}
      </p>
      <StripLegend />
      {progress.passes.map((p) => (
        <PassCard key={p.pass} pass={p} rows={block.rows} />
      ))}
      <section className="rounded-2xl border-2 border-line bg-panel p-4" aria-labelledby="untied">
        <h2 id="untied" className="mb-2 text-xl font-bold">
          Pruned but not tied
        </h2>
        {progress.prunedNotTied.length ? (
          <p data-testid="pruned-not-tied">
            {progress.prunedNotTied.length} {progress.prunedNotTied.length === 1 ? 'row' : 'rows'}: {progress.prunedNotTied.join(', ')}
          </p>
        ) : (
          <p>No row is waiting to be tied.</p>
        )}
      </section>
    </div>
  );
}
