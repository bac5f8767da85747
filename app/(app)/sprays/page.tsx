import type { Metadata } from 'next';
import { SprayForm } from '@/components/sprays/spray-form';
import { can } from '@/lib/roles';
import { memberForPage } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { listBlocks } from '@/lib/server/queries/blocks';
import { listSprays } from '@/lib/server/queries/sprays';

export const metadata: Metadata = { title: 'Sprays' };

const when = (d: Date) => d.toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' });

export default async function SpraysPage() {
  const member = await memberForPage();
  const [blocks, sprays] = await Promise.all([listBlocks(db(), member.organisationId), listSprays(db(), member.organisationId)]);
  const now = Date.now();
  return (
    <div className="flex flex-col gap-6">
      <div>
        <h1 className="text-3xl font-extrabold">Sprays and re-entry</h1>
        <p className="mt-2 max-w-2xl rounded-lg border-2 border-cut bg-cut-tint p-3">
          Record each application with the restricted-entry interval (REI) printed on its label; when two products were applied together, enter the longer REI.
          Vineward warns scouts who open the block before the interval ends. The label, the posted signs and local rules always decide who may enter.
        </p>
      </div>
      {can(member.role, 'manage-organisation') && (
        <section className="rounded-2xl border-2 border-line bg-panel p-4">
          <h2 className="mb-3 text-xl font-bold">Record a spray</h2>
          <SprayForm blocks={blocks.map((b) => ({ id: b.id, name: b.name }))} />
        </section>
      )}
      <section>
        <h2 className="mb-2 text-xl font-bold">Recent sprays</h2>
        {sprays.length === 0 ? (
          <p className="text-bark-soft">No sprays recorded.</p>
        ) : (
          <div className="overflow-x-auto" role="region" aria-label="Sprays" tabIndex={0}>
            <table className="w-full border-collapse text-left">
              <thead>
                <tr className="border-b-2 border-line">
                  <th className="py-2 pr-3">Block</th>
                  <th className="pr-3">Product</th>
                  <th className="pr-3">Applied</th>
                  <th className="pr-3">REI</th>
                  <th>Re-entry from</th>
                </tr>
              </thead>
              <tbody>
                {sprays.map((s) => {
                  const active = new Date(s.reentryAt).getTime() > now;
                  return (
                    <tr key={s.id} id={`spray-${s.id}`} className="scroll-mt-4 border-b border-line target:bg-cut-tint target:outline-3 target:outline-cut">
                      <td className="py-2 pr-3">{s.blockName}</td>
                      <td className="pr-3">{s.product}</td>
                      <td className="pr-3">{when(new Date(s.appliedAt))}</td>
                      <td className="pr-3">{s.reiHours} h</td>
                      <td className={active ? 'font-bold text-alarm' : ''}>
                        {when(new Date(s.reentryAt))}
                        {active ? ' — in force' : ''}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
        )}
      </section>
    </div>
  );
}
