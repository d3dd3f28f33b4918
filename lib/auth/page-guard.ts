import 'server-only';
// Guard for pages: a signed-out visitor goes to the sign-in page, a role that may
// not see the page gets the 403 page (forbidden() with experimental.authInterrupts), and
// one who must replace a one-time password goes to the change-password page.
import { forbidden, redirect } from 'next/navigation';
import { isAppError } from '@/lib/errors';
import { PAGES, type Action, type PageKey } from './roles';
import { requireAction } from './require-role';
import type { SessionUser } from './session-user';

export async function guardPage(page: PageKey): Promise<SessionUser> {
  try {
    return await requireAction(PAGES[page].needs);
  } catch (error) {
    // a one-time password from an admin: nothing but choosing a new one until then
    if (isAppError(error) && error.code === 'forbidden:password-change') redirect('/change-password');
    if (isAppError(error) && error.kind === 'unauthorized') redirect(`/sign-in?callbackUrl=${encodeURIComponent(PAGES[page].href)}`);
    if (isAppError(error) && error.kind === 'forbidden') forbidden();
    throw error;
  }
}

/** guardPage for a page that needs an action rather than a navigation entry (a job's edit page: jobs:write). */
export async function guardAction(action: Action, returnTo: string): Promise<SessionUser> {
  try {
    return await requireAction(action);
  } catch (error) {
    // a one-time password from an admin: nothing but choosing a new one until then
    if (isAppError(error) && error.code === 'forbidden:password-change') redirect('/change-password');
    if (isAppError(error) && error.kind === 'unauthorized') redirect(`/sign-in?callbackUrl=${encodeURIComponent(returnTo)}`);
    if (isAppError(error) && error.kind === 'forbidden') forbidden();
    throw error;
  }
}
