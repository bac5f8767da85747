import type { Metadata } from 'next';
import { DeskProgress } from '@/components/desk/desk-progress';
import { DeskView } from '@/components/desk/desk-view';
import { memberForPage } from '@/lib/server/auth/guard';
import { loadDesk } from '@/lib/server/services/desk';

export const metadata: Metadata = { title: 'Desk' };

export default async function DeskPage() {
  const member = await memberForPage();
  const desk = await loadDesk(member);
  return (
    <DeskView
      desk={desk}
      name={member.name ?? member.email}
      progress={desk.progress && <DeskProgress rows={desk.progress} blockHref={(id) => `/work/${id}`} />}
    />
  );
}
