// One line per unexpected server error: where it happened and the error's code, never
// the error object itself. A failed database query's message carries the SQL and its
// parameters (a bcrypt hash, an e-mail), so neither the message nor the stack is
// printed (ASVS 4.0.3 V7.1.1, V8.3.4).

/** The first `code` along the cause chain (mysql2's ER_…, Node's E…), else the error's name. */
export function errorCode(error: unknown): string {
  for (let e: unknown = error, depth = 0; e && depth < 8; e = (e as { cause?: unknown }).cause, depth++) {
    const code = (e as { code?: unknown }).code;
    if (typeof code === 'string' && /^[\w:.-]{1,64}$/.test(code)) return code;
  }
  const name = (error as { name?: unknown } | null)?.name;
  return typeof name === 'string' && /^\w{1,64}$/.test(name) ? name : 'unknown';
}

export function logUnexpected(where: string, error: unknown): void {
  console.error(`[kerfcast] unexpected error in ${where}: ${errorCode(error)}`);
}
