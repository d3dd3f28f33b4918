// The security headers every response carries (OWASP ASVS 4.0.3 level 2, V14.4): one
// Content Security Policy for the whole app, so that next.config.mjs (static files, API
// JSON, anything the proxy does not see) and proxy.ts (pages, with a fresh nonce per
// request) send the same rules. Plain JavaScript because next.config.mjs imports it
// before any TypeScript is compiled; types in security-headers.d.mts.

/**
 * Features the app does not use, denied to the page and to any frame (an empty
 * allow-list). Only names the browser knows: an unknown one is logged as a console error.
 */
const DENIED_FEATURES = [
  'accelerometer',
  'autoplay',
  'bluetooth',
  'camera',
  'display-capture',
  'encrypted-media',
  'geolocation',
  'gyroscope',
  'hid',
  'idle-detection',
  'magnetometer',
  'microphone',
  'midi',
  'payment',
  'picture-in-picture',
  'publickey-credentials-get',
  'screen-wake-lock',
  'serial',
  'usb',
  'xr-spatial-tracking',
];

/**
 * The Content-Security-Policy value.
 * - Only the app's own origin for every kind of resource.
 * - Scripts: 'self' and, on pages, the request's nonce, which Next.js puts on its inline
 *   hydration scripts; no 'unsafe-inline'. 'wasm-unsafe-eval' lets the polygon library
 *   compile its WebAssembly (it will also run in a browser worker, which inherits or
 *   receives this policy). 'unsafe-eval' only under `next dev`, where React rebuilds
 *   server error stacks with eval.
 * - Styles: 'self' (the built CSS files) and the nonce for any style element Next.js
 *   writes; no 'unsafe-inline' outside `next dev`, whose error overlay needs it.
 * - Workers: 'self' and blob:, because the bundler may start a worker from a small
 *   blob: bootstrap that then loads its chunks from our origin.
 * - The viewer's Web Worker (option `worker`, sent only on the bundler's worker entry
 *   script, whose response headers are the worker's own policy): also 'unsafe-eval'. The
 *   polygon library's WebAssembly bindings name their generated wrapper functions with
 *   `Function(...)`; without it the worker cannot load the engine. A worker has no DOM, no
 *   cookies and no access to the page; documents never get this source.
 * - upgrade-insecure-requests only when the app is served over https: on a plain-http
 *   loopback address it would ask for https copies that do not exist.
 *
 * @param {{ nonce?: string, https: boolean, dev: boolean, worker?: boolean }} options
 * @returns {string}
 */
export function contentSecurityPolicy({ nonce, https, dev, worker = false }) {
  const nonceSource = nonce ? [`'nonce-${nonce}'`] : [];
  const directives = [
    ['default-src', "'self'"],
    ['script-src', "'self'", ...nonceSource, "'wasm-unsafe-eval'", ...(dev || worker ? ["'unsafe-eval'"] : [])],
    ['style-src', "'self'", ...(dev ? ["'unsafe-inline'"] : nonceSource)],
    ['img-src', "'self'"],
    ['font-src', "'self'"],
    ['connect-src', "'self'"],
    ['worker-src', "'self'", 'blob:'],
    ['manifest-src', "'self'"],
    ['media-src', "'self'"],
    ['frame-src', "'none'"],
    ['object-src', "'none'"],
    ['base-uri', "'self'"],
    ['form-action', "'self'"],
    ['frame-ancestors', "'none'"],
    ...(https ? [['upgrade-insecure-requests']] : []),
  ];
  return directives.map((d) => d.join(' ')).join('; ');
}

/**
 * Every security header as [name, value] pairs, the CSP included. HSTS only over https:
 * browsers ignore it on plain http, and a loopback install has no certificate.
 *
 * @param {{ nonce?: string, https: boolean, dev: boolean, worker?: boolean }} options
 * @returns {[string, string][]}
 */
export function securityHeaders(options) {
  /** @type {[string, string][]} */
  const headers = [
    ['Content-Security-Policy', contentSecurityPolicy(options)],
    ['X-Content-Type-Options', 'nosniff'],
    ['Referrer-Policy', 'strict-origin-when-cross-origin'],
    ['Permissions-Policy', DENIED_FEATURES.map((f) => `${f}=()`).join(', ')],
  ];
  // At least a year and, from level 2, every subdomain too (ASVS 5.0 V3.4.1, the successor
  // of 4.0.3 V14.4.5). A deployment whose sibling hosts still serve plain http must fix
  // those first, or serve the app from a host of its own.
  if (options.https) headers.push(['Strict-Transport-Security', 'max-age=31536000; includeSubDomains']);
  return headers;
}

/** @param {string | undefined} appUrl */
export function isHttpsUrl(appUrl) {
  return typeof appUrl === 'string' && appUrl.startsWith('https://');
}

/**
 * The bundler's worker entry scripts (path-to-regexp source for next.config.mjs headers()):
 * a Web Worker started from one of them runs under that response's policy.
 */
export const WORKER_ENTRY_SOURCE = '/_next/static/chunks/:file(turbopack-worker-.*)';
