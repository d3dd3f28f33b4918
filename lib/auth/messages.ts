// The only two things a failed sign-in may say. Neither tells whether the e-mail
// belongs to an account. Shared by the server check and the sign-in form.
export const SIGN_IN_FAILED_MESSAGE = 'E-mail or password is not right.';
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
