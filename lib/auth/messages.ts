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

const PROBE_ORIGIN = 'http://kerfcast.invalid';

/** true when a browser would leave the app's origin for this path (protocol-relative //host, /\host) */
function leavesOrigin(path: string): boolean {
  return path.startsWith('//') || path.startsWith('/\\') || new URL(path, PROBE_ORIGIN).origin !== PROBE_ORIGIN;
}

/**
 * The path to go to after sign-in: a same-origin app path only (ASVS 4.0.3 V5.1.5). The
 * value is normalised the way a browser resolves it ("/.//evil.example", "/jobs/..//x"
 * and "/%2e//x" all become "//…", another host) and refused, with the fallback (the
 * role's home), when it is anything but a plain path on this origin: absolute URLs,
 * "//" and "/\" starts, backslashes or control characters anywhere, the sign-in page and
 * the API.
 */
export function safeCallbackPath(raw: string | null | undefined, fallback = '/jobs'): string {
  if (!raw || raw.length > 2048 || !raw.startsWith('/') || /[\\\u0000-\u001f\u007f]/.test(raw)) return fallback;
  try {
    if (leavesOrigin(raw)) return fallback;
    const url = new URL(raw, PROBE_ORIGIN);
    const path = `${url.pathname}${url.search}`;
    if (leavesOrigin(path) || url.pathname.startsWith('/sign-in') || url.pathname.startsWith('/api/')) return fallback;
    return path;
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
