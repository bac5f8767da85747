import type { ReactNode } from 'react';
import { FieldShell } from '@/components/field/field-shell';
import { memberForPage } from '@/lib/server/auth/guard';

export default async function FieldLayout({ children }: { children: ReactNode }) {
  const member = await memberForPage();
  return <FieldShell owner={member.email}>{children}</FieldShell>;
}
