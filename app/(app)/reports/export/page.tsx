import type { Metadata } from 'next';
import Link from 'next/link';
import { ButtonLink } from '@/components/ui/button';
import { CSV_COLUMNS, CSV_COLUMN_NOTES } from '@/lib/reports/csv';
import { defaultSeason } from '@/lib/reports/season';
import { memberForPage } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { listBlocks } from '@/lib/server/queries/blocks';
import { listSeasons } from '@/lib/server/queries/reports';

export const metadata: Metadata = { title: 'Observation export' };

export default async function ExportPage() {
  const member = await memberForPage();
  const month = member.seasonStartMonth;
  const [seasons, blocks] = await Promise.all([listSeasons(db(), member.organisationId, undefined, month), listBlocks(db(), member.organisationId)]);
  const season = defaultSeason(seasons, new Date(), month);
  return (
    <div className="flex max-w-4xl flex-col gap-5">
      <header>
        <p className="text-bark-soft">
          <Link href="/reports">Reports</Link>
        </p>
        <h1 className="text-3xl font-extrabold">Observation export (CSV)</h1>
        <p className="mt-1">
          Every live observation of a season behind the reports, one line each, oldest first. The file is UTF-8 with a byte-order mark (so spreadsheets read
          accents right), comma-separated, lines ending CR LF. Text holding a comma, a quote or a line break is quoted, with quotes doubled; text starting with
          = + - or @ gets a leading apostrophe so no spreadsheet runs it as a formula. Columns are only ever added at the end.
        </p>
      </header>
      <section aria-labelledby="downloads" className="flex flex-col gap-2">
        <h2 id="downloads" className="text-2xl font-extrabold">
          Download
        </h2>
        {(seasons.length ? seasons : [season]).map((s) => (
          <div key={s} className="flex flex-wrap items-center gap-2">
            <ButtonLink href={`/api/reports/observations.csv?season=${s}`} variant="secondary" prefetch={false}>
              All blocks, {s}
            </ButtonLink>
            {blocks.map((b) => (
              <ButtonLink key={b.id} href={`/api/reports/observations.csv?season=${s}&blockId=${b.id}`} variant="quiet" prefetch={false}>
                {b.name}, {s}
              </ButtonLink>
            ))}
          </div>
        ))}
      </section>
      <section aria-labelledby="columns" className="flex flex-col gap-2">
        <h2 id="columns" className="text-2xl font-extrabold">
          Columns
        </h2>
        <table
          className="w-full border-collapse text-left text-sm [&_td]:border-b [&_td]:border-line [&_td]:px-2 [&_td]:py-1 [&_th]:border-b-2 [&_th]:border-bark [&_th]:px-2"
          data-testid="csv-columns"
        >
          <thead>
            <tr>
              <th scope="col">#</th>
              <th scope="col">Column</th>
              <th scope="col">Meaning</th>
            </tr>
          </thead>
          <tbody>
            {CSV_COLUMNS.map((c, i) => (
              <tr key={c}>
                <td>{i + 1}</td>
                <td>
                  <code className="font-mono">{c}</code>
                </td>
                <td>{CSV_COLUMN_NOTES[c]}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
    </div>
  );
}
