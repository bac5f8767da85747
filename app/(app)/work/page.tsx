import type { Metadata } from 'next';
import Link from 'next/link';
import { EstateProgressTable } from '@/components/work/estate-progress-table';
import { memberForPage } from '@/lib/server/auth/guard';
import { currentSeason, loadEstateProgress } from '@/lib/server/services/row-work';
import { PAY_CAUTION } from '@/lib/work/cost';

export const metadata: Metadata = { title: 'Work progress' };

const seasonParam = (v: unknown, fallback: number) => (typeof v === 'string' && /^\d{4}$/.test(v) ? Number(v) : fallback);

export default async function WorkPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const member = await memberForPage();
  const now = currentSeason(member);
  const season = seasonParam((await searchParams).season, now);
  const progress = await loadEstateProgress(member.organisationId, season);
  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-bark-soft">{member.organisationName}</p>
          <h1 className="text-3xl font-extrabold">Work progress, season {season}</h1>
        </div>
        <nav aria-label="Seasons and export" className="flex flex-wrap gap-2">
          {[now - 2, now - 1, now].map((s) => (
            <Link
              key={s}
              href={`/work?season=${s}`}
              aria-current={s === season ? 'page' : undefined}
              className="flex min-h-touch items-center rounded-lg border-2 border-line px-3 font-bold no-underline aria-[current=page]:border-rootstock"
            >
              {s}
            </Link>
          ))}
          <a
            href={`/api/reports/row-work.csv?season=${season}`}
            className="flex min-h-touch items-center rounded-lg border-2 border-rootstock px-3 font-bold text-rootstock no-underline"
          >
            Export CSV
          </a>
        </nav>
      </div>
      <p className="rounded-lg border-2 border-cut bg-cut-tint p-3 text-sm">{PAY_CAUTION}</p>
      {progress.blocks.length ? <EstateProgressTable blocks={progress.blocks} season={season} /> : <p>No blocks yet.</p>}
    </div>
  );
}
