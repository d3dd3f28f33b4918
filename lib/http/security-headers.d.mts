// Types of security-headers.mjs (plain JavaScript so that next.config.mjs can import it).
export interface SecurityHeaderOptions {
  /** the request's CSP nonce (pages only; base64) */
  nonce?: string;
  /** the app is served over https (APP_URL) */
  https: boolean;
  /** `next dev`: React's debugging needs eval and the error overlay inline styles */
  dev: boolean;
  /** the policy of a Web Worker's entry script: adds 'unsafe-eval' (the polygon library's bindings) */
  worker?: boolean;
}
export function contentSecurityPolicy(options: SecurityHeaderOptions): string;
export function securityHeaders(options: SecurityHeaderOptions): [string, string][];
export function isHttpsUrl(appUrl: string | undefined): boolean;
export const WORKER_ENTRY_SOURCE: string;
