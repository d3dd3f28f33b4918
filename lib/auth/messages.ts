// Texts of the sign-in and role rules that people read. A failed sign-in may say only
// one of two things, and neither tells whether the e-mail belongs to an account
// (shared by the server check and the sign-in form). Who may do something is read
// from the role table, so a page never names roles the table does not give.
import { rolesFor, type Action } from '@/lib/auth/roles';
import { ROLE_IN_SENTENCE } from '@/lib/validation/enums';

export const SIGN_IN_FAILED_MESSAGE = 'Wrong e-mail or password. Check both and try again.';
export const SIGN_IN_RATE_LIMITED_MESSAGE = 'Too many failed sign-ins. Wait 15 minutes and try again.';

/** Maps whatever next-auth reports (?error=… or signIn()'s error) to one of the two messages. */
export function signInErrorMessage(reported: string | null | undefined): string | null {
  if (!reported) return null;
  return reported === SIGN_IN_RATE_LIMITED_MESSAGE ? SIGN_IN_RATE_LIMITED_MESSAGE : SIGN_IN_FAILED_MESSAGE;
}

/** Only same-site paths are followed after sign-in, never another origin. */
export function safeCallbackPath(raw: string | null | undefined, fallback = '/jobs'): string {
  if (!raw) return fallback;
  try {
    const url = new URL(raw, 'http://kerfcast.invalid');
    if (url.origin !== 'http://kerfcast.invalid' || url.pathname.startsWith('/sign-in') || url.pathname.startsWith('/api/')) return fallback;
    return `${url.pathname}${url.search}`;
  } catch {
    return fallback;
  }
}

/**
 * The roles that may do an action, as words in a sentence: "an admin or a programmer"
 * ("An admin or a programmer" when the sentence starts with them).
 */
export function whoMay(action: Action, startsSentence = false): string {
  const words = rolesFor(action).map((role) => ROLE_IN_SENTENCE[role]);
  const phrase = words.length <= 1 ? (words[0] ?? 'nobody') : `${words.slice(0, -1).join(', ')} or ${words[words.length - 1]}`;
  return startsSentence ? phrase.charAt(0).toUpperCase() + phrase.slice(1) : phrase;
}
