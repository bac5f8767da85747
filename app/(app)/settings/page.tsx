import type { Metadata } from 'next';
import { can } from '@/lib/roles';
import { memberForPage } from '@/lib/server/auth/guard';
import { loadPayBasis } from '@/lib/server/services/row-work';
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
          <p>
            Seasons start in {MONTHS[member.seasonStartMonth - 1]}. A manager can change this.
          </p>
        )}
      </section>
      <PayBasisSection member={member} pay={await loadPayBasis(member.organisationId)} />
    </div>
  );
}
