import 'server-only';
// Guard for pages: a signed-out visitor goes to the sign-in page, a role that may
// not see the page gets the 403 page (forbidden() with experimental.authInterrupts).
import { forbidden, redirect } from 'next/navigation';
import { isAppError } from '@/lib/errors';
import { PAGES, type PageKey } from './roles';
import { requireAction } from './require-role';
import type { SessionUser } from './session-user';

export async function guardPage(page: PageKey): Promise<SessionUser> {
  try {
    return await requireAction(PAGES[page].needs);
  } catch (error) {
    if (isAppError(error) && error.kind === 'unauthorized') redirect(`/sign-in?callbackUrl=${encodeURIComponent(PAGES[page].href)}`);
    if (isAppError(error) && error.kind === 'forbidden') forbidden();
    throw error;
  }
}
