'use client';
// Ends the session through next-auth and returns to the sign-in page.
import { signOut } from 'next-auth/react';

export function SignOutButton() {
  return (
    <button
      type="button"
      onClick={() => signOut({ callbackUrl: '/sign-in' })}
      className="min-h-target rounded-md border-2 border-night-line px-3 font-bold text-white hover:bg-night-raised focus-visible:outline-spruce-light"
    >
      Sign out
    </button>
  );
}
