import type { Metadata } from 'next';
import { VineStepper } from '@/components/field/vine-stepper';
import { memberForPage } from '@/lib/server/auth/guard';
import { AppError } from '@/lib/server/errors';
import { fieldLayoutJson } from '@/lib/server/services/field';
import { blockIdParams } from '@/lib/validation/params';

export const metadata: Metadata = { title: 'Walk' };

type Search = Record<string, string | string[] | undefined>;

const positive = (v: string | string[] | undefined) => {
  const n = Number(typeof v === 'string' ? v : undefined);
  return Number.isInteger(n) && n > 0 ? n : undefined;
};

/**
 * Rendered with the block's layout and the vine from the address, so the vine shows in the first
 * paint; the stepper then keeps the layout fresh and reads plans and tasks on the phone.
 */
export default async function WalkPage({ params, searchParams }: { params: Promise<{ blockId: string }>; searchParams: Promise<Search> }) {
  const member = await memberForPage();
  const { blockId } = await params;
  const q = await searchParams;
  const row = positive(q.row);
  const position = positive(q.position);
  let layout;
  if (blockIdParams.safeParse({ blockId }).success) {
    try {
      layout = await fieldLayoutJson(member, blockId);
    } catch (err) {
      // Not found, or the database is away: the stepper reads the phone's copy as it always did.
      if (!(err instanceof AppError)) throw err;
    }
  }
  return (
    <VineStepper
      blockId={blockId}
      owner={member.email}
      initialLayout={layout}
      initialAddress={row && position && !q.plan && !q.task ? { row, position } : undefined}
      role={member.role}
    />
  );
}
