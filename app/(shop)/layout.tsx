// The signed-in app: navigation for the user's role above every page. The proxy
// already keeps signed-out visitors out; this re-checks against the user row.
// No loading.tsx in this group on purpose: streaming would start before a page calls
// forbidden(), and the 403 page would then go out with status 200.
import { redirect } from 'next/navigation';
import type { ReactNode } from 'react';
import { AppNav } from '@/components/shell/app-nav';
import { currentUser } from '@/lib/auth/require-role';

export default async function ShopLayout({ children }: { children: ReactNode }) {
  const user = await currentUser();
  if (!user) redirect('/sign-in');
  if (user.mustChangePassword) redirect('/change-password');
  return (
    <>
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-10 focus:bg-panel focus:p-3">
        Skip to content
      </a>
      <AppNav user={user} />
      <main id="main" className="mx-auto max-w-page px-4 py-8">
        {children}
      </main>
    </>
  );
}
