import type { Metadata } from 'next';
import { can } from '@/lib/roles';
import { memberForPage } from '@/lib/server/auth/guard';
import { loadPayBasis } from '@/lib/server/services/row-work';
import { loadSettingsScreen } from '@/lib/server/services/settings';
import { JudgementSettings } from '@/components/settings/judgement-settings';
import { MONTHS, seasonBounds, seasonOf } from '@/lib/reports/season';
import { formatAreaM2, formatLengthM } from '@/lib/units';
import { SeasonForm } from './season-form';
import { PayBasisSection } from './pay-section';
import { UnitForm } from './unit-form';

export const metadata: Metadata = { title: 'Settings' };

export default async function SettingsPage() {
  const member = await memberForPage();
  const season = seasonOf(new Date(), member.seasonStartMonth);
  const { from, to } = seasonBounds(season, member.seasonStartMonth);
  const screen = await loadSettingsScreen(member);
  return (
    <div className="flex max-w-3xl flex-col gap-6">
      <div>
        <p className="text-bark-soft">{member.organisationName}</p>
        <h1 className="text-3xl font-extrabold">Settings</h1>
      </div>
      <section className="rounded-2xl border-2 border-line bg-panel p-4">
        <h2 className="mb-2 text-xl font-bold">Units</h2>
        <p className="mb-3">Spacings, sizes and areas are stored exactly and shown and typed in the units the organisation chooses, for everyone in it.</p>
        {can(member.role, 'manage-organisation') ? (
          <UnitForm current={member.unitSystem} />
        ) : (
          <p data-testid="unit-system">
            {member.organisationName} uses <strong>{member.unitSystem}</strong> units (e.g. {formatLengthM(2.4, member.unitSystem)},{' '}
            {formatAreaM2(12_000, member.unitSystem)}). A manager can change this.
          </p>
        )}
      </section>
      <section className="rounded-2xl border-2 border-line bg-panel p-4">
        <h2 className="mb-2 text-xl font-bold">Seasons</h2>
        <p className="mb-3">
          Reports, exports and weights count by season. This season is <strong data-testid="current-season">{season}</strong>: from {from.slice(0, 10)} up to{' '}
          {to.slice(0, 10)} (UTC).
        </p>
        {can(member.role, 'manage-organisation') ? (
          <SeasonForm current={member.seasonStartMonth} />
        ) : (
          <p>Seasons start in {MONTHS[member.seasonStartMonth - 1]}. A manager can change this.</p>
        )}
      </section>
      <PayBasisSection member={member} pay={await loadPayBasis(member.organisationId)} />
      <section className="rounded-2xl border-2 border-line bg-panel p-4" aria-labelledby="judgement-title">
        <h2 id="judgement-title" className="mb-2 text-xl font-bold">
          Judgements
        </h2>
        <p className="mb-3">
          The limits behind the verdicts on the phone, the grid and the reports: cane sizes, bud loads, Ravaz ranges and the rest. Each default names its
          source; where sources disagree, set the organisation&apos;s own or a block&apos;s own. Phones pick up a block&apos;s settings with its layout, so they
          apply offline from the next time the block is opened with signal.
        </p>
        <JudgementSettings initial={screen.organisation} blocks={screen.blocks} canEdit={can(member.role, 'manage-organisation')} />
      </section>
    </div>
  );
}
