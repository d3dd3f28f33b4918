// Next.js configuration. authInterrupts enables forbidden() so a page a role may not
// see answers with a real 403 and app/forbidden.tsx, rather than a redirect or a
// blank screen. Source maps in production help the shop read its own stack traces.
//
// headers(): the security headers of lib/http/security-headers.mjs on every response,
// static files and API JSON included (proxy.ts does not run for those). Pages get the
// same policy again from proxy.ts, with the request's nonce; a header set there
// replaces the one set here. Next.js reads headers() at build time, so HSTS on static
// files follows the APP_URL the build saw; pages follow the running server's APP_URL.
//
// The viewer's worker entry script gets the worker policy (see security-headers.mjs).
//
// turbopack.resolveAlias: in browser bundles (the viewer's Web Worker) gcode-parser's top-level
// Node imports get the stand-ins of workers/shims/node-builtins-browser.ts, and the polygon
// library its web build (the same Clipper WebAssembly, without the Node file loader).
import { isHttpsUrl, securityHeaders, WORKER_ENTRY_SOURCE } from './lib/http/security-headers.mjs';

const BROWSER_SHIM = './workers/shims/node-builtins-browser.ts';

/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  experimental: {
    authInterrupts: true,
  },
  // Native MariaDB driver and bcrypt stay as Node modules on the server, and so does the
  // analysis's Clipper build, which finds and instantiates its WebAssembly at run time;
  // piscina starts its worker threads from files of its own package.
  serverExternalPackages: ['mysql2', 'bcryptjs', 'js-angusj-clipper', 'piscina'],
  turbopack: {
    resolveAlias: {
      events: { browser: BROWSER_SHIM },
      fs: { browser: BROWSER_SHIM },
      stream: { browser: BROWSER_SHIM },
      timers: { browser: BROWSER_SHIM },
      'js-angusj-clipper': { browser: 'js-angusj-clipper/web' },
    },
  },
  async headers() {
    const options = { https: isHttpsUrl(process.env.APP_URL), dev: process.env.NODE_ENV === 'development' };
    const pairs = (list) => list.map(([key, value]) => ({ key, value }));
    // the later rule's Content-Security-Policy replaces the first one's on the worker entry
    return [
      { source: '/:path*', headers: pairs(securityHeaders(options)) },
      { source: WORKER_ENTRY_SOURCE, headers: pairs(securityHeaders({ ...options, worker: true }).filter(([key]) => key === 'Content-Security-Policy')) },
    ];
  },
};

export default nextConfig;
