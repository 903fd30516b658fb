'use client';

import { signOut } from 'next-auth/react';

export function SignOutButton() {
  return (
    <button type="button" onClick={() => signOut({ callbackUrl: '/' })} className="rounded px-3 py-1.5 text-sm font-semibold text-ink-700 hover:bg-chalk-100">
      Sign out
    </button>
  );
}
