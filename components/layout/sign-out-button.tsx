'use client';

import { signOut } from 'next-auth/react';

export function SignOutButton() {
  return (
    <button
      type="button"
      className="min-h-touch rounded-lg px-3 font-bold text-bark-soft hover:bg-rootstock-tint"
      onClick={() => signOut({ callbackUrl: '/signin' })}
    >
      Sign out
    </button>
  );
}
