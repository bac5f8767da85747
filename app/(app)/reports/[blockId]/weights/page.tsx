import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { Measurements } from '@/components/reports/measurement-form';
import { isUuid } from '@/lib/grid/filters';
import { can } from '@/lib/roles';
import { seasonBounds, seasonOf } from '@/lib/reports/season';
import { memberForPage } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { getBlock } from '@/lib/server/queries/blocks';

export const metadata: Metadata = { title: 'Yields and pruning weights' };

export default async function WeightsPage({ params, searchParams }: { params: Promise<{ blockId: string }>; searchParams: Promise<{ season?: string }> }) {
  const member = await memberForPage();
  const { blockId } = await params;
  const block = isUuid(blockId) ? await getBlock(db(), member.organisationId, blockId) : undefined;
  if (!block) notFound();
  const asked = Number((await searchParams).season);
  const season = Number.isInteger(asked) && asked >= 1900 && asked <= 2200 ? asked : seasonOf(new Date(), member.seasonStartMonth);
  const { from, to } = seasonBounds(season, member.seasonStartMonth);
  return (
    <div className="flex max-w-4xl flex-col gap-5">
      <header>
        <p className="text-bark-soft">
          <Link href={`/reports/${block.id}?season=${season}`}>Back to the {block.name} report</Link>
        </p>
        <h1 className="text-3xl font-extrabold">
          {block.name}: yields and pruning weights, {season}
        </h1>
        <p className="mt-1 max-w-3xl">
          Weigh the fruit picked at harvest and the one-year wood cut off at winter pruning, for single vines or for a row sample weighed together. Pruning
          weights give each vine its balanced-pruning bud target; a harvest paired with the next winter&apos;s prunings gives the Ravaz index. Season {season}{' '}
          holds what was weighed from {from.slice(0, 10)} up to {to.slice(0, 10)}.
        </p>
      </header>
      <Measurements
        block={{ id: block.id, name: block.name, vinesPerPanel: block.vines_per_panel }}
        season={season}
        period={{ from, to }}
        units={member.unitSystem}
        canRecord={can(member.role, 'record-observations')}
        canRemoveAny={can(member.role, 'edit-any-observation')}
        userId={member.userId}
      />
    </div>
  );
}
