import Link from 'next/link';
import { DeskSection, Meter } from '@/components/desk/desk-parts';
import type { DeskProgressRow } from '@/lib/desk/types';
import { formatDay } from '@/lib/grid/labels';
import { formatCount } from '@/lib/units';

const passLabel = (pass: string) => pass.charAt(0).toUpperCase() + pass.slice(1).replace(/-/g, ' ');

/**
 * Winter work per block and pass, with the finish projected at the current pace. It shows the
 * rows it is given (the row-work progress of the estate) and works nothing out itself; with no rows
 * it says there is no row work recorded yet. `blockHref` says where a block's progress is handled.
 */
export function DeskProgress({ rows, blockHref = (id) => `/blocks/${id}` }: { rows: DeskProgressRow[]; blockHref?: (blockId: string) => string }) {
  return (
    <DeskSection id="progress" title="Winter work" count={rows.length} unit={rows.length === 1 ? 'pass under way' : 'passes under way'}>
      {rows.length === 0 ? (
        <p>No row work recorded this season yet.</p>
      ) : (
        <ul className="flex flex-col gap-3">
          {rows.map((r) => (
            <li key={`${r.blockId}:${r.pass}`} data-testid="desk-progress">
              <p className="flex flex-wrap justify-between gap-x-3">
                <Link href={blockHref(r.blockId)} className="font-bold text-rootstock underline">
                  {r.blockName}: {passLabel(r.pass)}
                </Link>
                <span>{r.projectedFinish ? `Finish about ${formatDay(r.projectedFinish)}` : 'No pace yet'}</span>
              </p>
              <Meter done={r.vinesDone} of={r.vineCount} />
              <p className="text-bark-soft">
                {formatCount(r.vinesDone)} of {formatCount(r.vineCount)} vines
              </p>
            </li>
          ))}
        </ul>
      )}
    </DeskSection>
  );
}
