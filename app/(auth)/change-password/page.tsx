// Changing one's own password. A user whose password an admin set for one sign-in is
// sent here by every page until they have chosen their own.
import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { ChangePasswordForm } from '@/components/auth/change-password-form';
import { Notice } from '@/components/ui/notice';
import { currentUser } from '@/lib/auth/require-role';
import { homeFor } from '@/lib/auth/roles';
import { changePasswordAction } from './actions';

export const metadata: Metadata = { title: 'Change password' };

export default async function ChangePasswordPage() {
  const user = await currentUser();
  if (!user) redirect(`/sign-in?callbackUrl=${encodeURIComponent('/change-password')}`);
  return (
    <main className="flex min-h-screen items-center justify-center p-6">
      <div className="flex w-full max-w-md flex-col gap-6 rounded-lg border-2 border-rule bg-panel p-8 shadow-sm">
        <div>
          <p className="mb-1 font-mono text-sm uppercase tracking-widest text-spruce">Kerfcast</p>
          <h1>Change password</h1>
          <p className="text-ink-soft">Signed in as {user.email}.</p>
        </div>
        {user.mustChangePassword ? (
          <Notice tone="caution" title="Choose your own password to go on." role="status">
            An admin set your current password for one sign-in only.
          </Notice>
        ) : null}
        <ChangePasswordForm action={changePasswordAction} homePath={homeFor(user.role)} />
      </div>
    </main>
  );
}
