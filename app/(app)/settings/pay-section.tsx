import { can } from '@/lib/roles';
import type { Member } from '@/lib/server/auth/guard';
import { PAY_CAUTION, type PayBasis } from '@/lib/work/cost';
import { PayForm } from './pay-form';

/** How row work is costed on the progress pages: an hourly rate or a piece rate per vine. */
export function PayBasisSection({ member, pay }: { member: Member; pay: PayBasis }) {
  return (
    <section className="rounded-2xl border-2 border-line bg-panel p-4" aria-labelledby="pay-title">
      <h2 id="pay-title" className="mb-2 text-xl font-bold">
        Row work pay
      </h2>
      <p className="mb-3">Costs to date and projected costs on the work progress pages use this.</p>
      <p className="mb-3 rounded-lg border-2 border-cut bg-cut-tint p-3 font-bold" data-testid="pay-caution">
        {PAY_CAUTION}
      </p>
      {can(member.role, 'manage-organisation') ? (
        <PayForm current={pay} />
      ) : (
        <p>
          Row work is costed{' '}
          {pay.basis === 'hourly' ? `by the hour (${pay.hourlyRate ?? 'no rate yet'})` : `at a piece rate per vine (${pay.pieceRatePerVine ?? 'no rate yet'})`}.
          A manager can change this.
        </p>
      )}
    </section>
  );
}
