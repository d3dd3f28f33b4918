// The top bar of the signed-in app: the product name, the pages the user's role may
// use (from lib/auth/roles.ts), who is signed in, their password page, and sign-out.
import Link from 'next/link';
import { pagesFor } from '@/lib/auth/roles';
import type { SessionUser } from '@/lib/auth/session-user';
import { ROLE_LABELS } from '@/lib/validation/enums';
import { NavLink } from './nav-link';
import { SignOutButton } from './sign-out-button';

export function AppNav({ user }: { user: SessionUser }) {
  return (
    <header className="bg-night text-white">
      <div className="mx-auto flex max-w-page flex-wrap items-center gap-x-6 gap-y-2 px-4 py-2">
        <span className="font-mono text-lg font-bold tracking-wider">KERFCAST</span>
        <nav aria-label="Main" className="flex flex-1 flex-wrap gap-1" data-testid="main-nav">
          {pagesFor(user.role).map((page) => (
            <NavLink key={page.key} href={page.href} label={page.label} />
          ))}
        </nav>
        <div className="flex items-center gap-3">
          <p className="text-sm">
            <span className="font-bold">{user.name}</span>
            <span className="text-rule-light"> · </span>
            <span data-testid="user-role">{ROLE_LABELS[user.role]}</span>
          </p>
          <Link href="/change-password" className="inline-flex min-h-target items-center text-sm font-bold text-white underline underline-offset-4">
            Password
          </Link>
          <SignOutButton />
        </div>
      </div>
    </header>
  );
}
