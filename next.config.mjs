// Next.js configuration. authInterrupts enables forbidden() so a page a role may not
// see answers with a real 403 and app/forbidden.tsx, rather than a redirect or a
// blank screen. Source maps in production help the shop read its own stack traces.
/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  experimental: {
    authInterrupts: true,
  },
  // Native MariaDB driver and bcrypt stay as Node modules on the server, and so does the
  // analysis's Clipper build, which finds and instantiates its WebAssembly at run time.
  serverExternalPackages: ['mysql2', 'bcryptjs', 'js-angusj-clipper'],
};

export default nextConfig;
