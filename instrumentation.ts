// Runs once when the Next.js server starts, before it takes requests (Next.js
// instrumentation). Reads the environment, so a server with a missing or unsafe setting
// stops here, with the settings named, rather than at its first request (Next.js would
// log the failure and keep listening), and installs the hook that records each request's
// client address from its connection (lib/http/client-address.ts).
// Then starts this process's estimate queue (lib/estimate-server/start.ts): its worker
// threads claim pending estimates from the database, and estimates an earlier life of the
// process left running are queued again, so a restart leaves nothing stuck.
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== 'nodejs') return;
  let trustedProxies: string[];
  try {
    trustedProxies = (await import('@/lib/env')).env.TRUSTED_PROXY;
  } catch (error) {
    console.error(`[kerfcast] not starting: ${error instanceof Error ? error.message : String(error)}`);
    process.exit(1);
  }
  const { installClientAddressHook } = await import('@/lib/http/client-address');
  installClientAddressHook(trustedProxies);
  const { startEstimateQueue } = await import('@/lib/estimate-server/start');
  await startEstimateQueue();
}
