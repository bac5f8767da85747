import type { Metadata } from 'next';
import { PlanForm } from '@/components/plans/plan-form';
import { can } from '@/lib/roles';
import { memberForPage } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { countSlotsByBlock, listBlocks } from '@/lib/server/queries/blocks';
import { listSamplingPlans } from '@/lib/server/queries/sampling-plans';
import { measuredYieldSpreads } from '@/lib/server/services/sampling-plans';
import { settingsForBlocks } from '@/lib/server/services/settings';

export const metadata: Metadata = { title: 'Sampling plans' };

export default async function PlansPage() {
  const member = await memberForPage();
  const [blocks, counts, plans, settingsOf, spreads] = await Promise.all([
    listBlocks(db(), member.organisationId),
    countSlotsByBlock(db(), member.organisationId),
    listSamplingPlans(db(), member.organisationId),
    settingsForBlocks(db(), member.organisationId),
    measuredYieldSpreads(member),
  ]);
  const names = new Map(blocks.map((b) => [b.id, b.name]));
  const vineCount = (id: string) => {
    const c = counts.get(id);
    return c ? c.planted + c.missing + c.dead + c.replant : 0;
  };
  return (
    <div className="flex flex-col gap-6">
      <div>
        <h1 className="text-3xl font-extrabold">Sampling plans</h1>
        <p className="mt-1 max-w-2xl text-bark-soft">
          A plan is a fixed list of vines spread over a block&apos;s quarters and its edge and inner rows, drawn from a stored seed so that every scout walks
          the same vines and next year&apos;s check can repeat them. Missing and dead slots are left out.
        </p>
      </div>
      {can(member.role, 'plan-sampling') && (
        <section className="rounded-2xl border-2 border-line bg-panel p-4">
          <h2 className="mb-3 text-xl font-bold">Draw a plan</h2>
          <PlanForm
            blocks={blocks.map((b) => {
              const { yieldCvPercent, sampleMarginPercent } = settingsOf(b.id).crop;
              const measured = spreads.get(b.id);
              return {
                id: b.id,
                name: b.name,
                vineCount: vineCount(b.id),
                yieldCvPercent: measured ? Number(measured.cvPercent.toFixed(1)) : yieldCvPercent,
                yieldCvFrom: measured ? `${measured.vines} single-vine yields of ${measured.season}` : "the block's setting",
                sampleMarginPercent,
              };
            })}
          />
        </section>
      )}
      <section>
        <h2 className="mb-2 text-xl font-bold">Plans</h2>
        {plans.length === 0 ? (
          <p className="text-bark-soft">No plans yet.</p>
        ) : (
          <ul className="flex flex-col gap-2">
            {plans.map((p) => (
              <li key={p.id} className="rounded-xl border-2 border-line bg-panel p-3">
                <p className="font-bold">
                  {p.name} · {names.get(p.blockId) ?? 'archived block'}
                </p>
                <p className="text-sm text-bark-soft">
                  {p.addresses.length} vines · seed {p.seed} · made {new Date(p.createdAt).toLocaleDateString('en-GB')}
                </p>
                <a className="font-bold text-rootstock underline" href={`/field/blocks/${p.blockId}/walk?plan=${p.id}`}>
                  Walk it in the field
                </a>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
