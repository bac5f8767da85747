import { redirect } from 'next/navigation';
import { homeFor } from '@/lib/roles';
import { currentMember } from '@/lib/server/auth/guard';

export default async function Home() {
  const member = await currentMember();
  redirect(member ? homeFor(member.role) : '/signin');
}
