'use client';

import { signOut } from '@/lib/auth-client';

export function SignOutButton() {
  return (
    <button
      type="button"
      className="min-h-touch rounded-lg px-3 font-bold text-bark-soft hover:bg-rootstock-tint"
      onClick={() => void signOut()}
    >
      Sign out
    </button>
  );
}
