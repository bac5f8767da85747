import type { Metadata } from 'next';
import { VineStepper } from '@/components/field/vine-stepper';
import { memberForPage } from '@/lib/server/auth/guard';

export const metadata: Metadata = { title: 'Walk' };

export default async function WalkPage({ params }: { params: Promise<{ blockId: string }> }) {
  const member = await memberForPage();
  const { blockId } = await params;
  return <VineStepper blockId={blockId} owner={member.email} />;
}
