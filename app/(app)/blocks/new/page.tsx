import type { Metadata } from 'next';
import { BlockForm } from '@/components/blocks/block-form';
import { memberForPage } from '@/lib/server/auth/guard';

export const metadata: Metadata = { title: 'New block' };

export default async function NewBlockPage() {
  const member = await memberForPage('manage-organisation');
  return (
    <div className="flex max-w-3xl flex-col gap-4">
      <h1 className="text-3xl font-extrabold">New block</h1>
      <p>
        Describe the block; its rows and planting slots are made for you. Rows of a different length can be set afterwards, one by one or with a layout CSV.
      </p>
      <BlockForm units={member.unitSystem} />
    </div>
  );
}
