import type { Metadata } from 'next';
import Link from 'next/link';
import { memberForPage } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { listGridBlocks } from '@/lib/server/queries/grid';
import { formatCount } from '@/lib/units';

export const metadata: Metadata = { title: 'Row grid' };

export default async function GridPickerPage() {
  const member = await memberForPage();
  const blocks = await listGridBlocks(db(), member.organisationId);
  return (
    <div className="flex flex-col gap-4">
      <header>
        <p className="text-bark-soft">{member.organisationName}</p>
        <h1 className="text-3xl font-extrabold">Row grid</h1>
        <p className="mt-1">Pick a block to see where its problem vines are.</p>
      </header>
      {blocks.length === 0 ? (
        <p className="rounded-xl border-2 border-line bg-panel p-4">There are no blocks yet. A manager sets them up under Blocks.</p>
      ) : (
        <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
          {blocks.map((b) => (
            <li key={b.id}>
              <Link
                href={`/grid/${b.id}`}
                className="flex min-h-touch flex-col gap-1 rounded-xl border-2 border-line bg-panel p-4 no-underline hover:border-rootstock"
              >
                <span className="text-xl font-bold">{b.name}</span>
                <span className="text-bark-soft">
                  {b.variety} · {b.rowCount} rows × {b.vinesPerRow} vines
                </span>
                <span>
                  <strong>{formatCount(b.urgentVines)}</strong> vines to act on now, <strong>{formatCount(b.actVines)}</strong> this season or sooner
                </span>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
