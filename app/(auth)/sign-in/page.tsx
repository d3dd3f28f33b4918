// The sign-in page. A visitor who is already signed in (and still enabled) goes on
// to the page they asked for.
import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { SignInForm } from '@/components/auth/sign-in-form';
import { safeCallbackPath, signInErrorMessage } from '@/lib/auth/messages';
import { currentUser } from '@/lib/auth/require-role';
import { homeFor } from '@/lib/auth/roles';

export const metadata: Metadata = { title: 'Sign in' };

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const params = await searchParams;
  const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);
  const user = await currentUser();
  const requested = first(params.callbackUrl);
  if (user) redirect(safeCallbackPath(requested, homeFor(user.role)));

  return (
    <main className="flex min-h-screen items-center justify-center p-6">
      <div className="w-full max-w-md rounded-lg border-2 border-rule bg-panel p-8 shadow-sm">
        <p className="mb-1 font-mono text-sm uppercase tracking-widest text-spruce">Kerfcast</p>
        <h1 className="mb-6">Sign in</h1>
        <SignInForm callbackPath={safeCallbackPath(requested, '/')} initialError={signInErrorMessage(first(params.error))} />
      </div>
    </main>
  );
}
