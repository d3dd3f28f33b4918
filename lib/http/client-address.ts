// The client address that the per-address sign-in limit counts (ASVS 4.0.3 V2.2.1).
// `next start` keeps an X-Forwarded-For that the client sent and only fills it in from
// the connection when it is missing, so a visitor could choose their own key, or name a
// shop's shared address to lock it out. The address is therefore taken from the
// connection itself, by a hook on Node's HTTP server (installed from instrumentation.ts
// before the first request), and written into a header of our own that the client
// cannot set: any copy it sent is dropped. X-Forwarded-For is believed only when the
// connection comes from one of TRUSTED_PROXY's addresses; then the address is the
// right-most entry that is not itself a trusted proxy (the one the proxy saw).
import http from 'node:http';

export const CLIENT_ADDRESS_HEADER = 'x-kerfcast-client-address';

/** ::ffff:127.0.0.1 → 127.0.0.1, so a dual-stack socket and an IPv4 list agree */
export function normaliseAddress(address: string): string {
  const trimmed = address.trim().replace(/^\[|\]$/g, '');
  const mapped = /^::ffff:(\d{1,3}(?:\.\d{1,3}){3})$/i.exec(trimmed);
  return (mapped ? mapped[1] : trimmed).toLowerCase();
}

export function resolveClientAddress(
  remoteAddress: string | undefined,
  forwardedFor: string | string[] | undefined,
  trustedProxies: readonly string[],
): string {
  const remote = remoteAddress ? normaliseAddress(remoteAddress) : 'unknown';
  const trusted = new Set(trustedProxies.map(normaliseAddress));
  if (!trusted.has(remote) || forwardedFor === undefined) return remote;
  const hops = (Array.isArray(forwardedFor) ? forwardedFor.join(',') : forwardedFor)
    .split(',')
    .map((hop) => hop.trim())
    .filter(Boolean)
    .map(normaliseAddress);
  for (let i = hops.length - 1; i >= 0; i--) {
    if (!trusted.has(hops[i])) return hops[i];
  }
  return remote;
}

/** The address the hook wrote; 'unknown' when the hook did not run (one shared key, never the client's choice). */
export function clientAddressFrom(headers: Headers | Record<string, string | string[] | undefined> | undefined): string {
  const raw = headers instanceof Headers ? headers.get(CLIENT_ADDRESS_HEADER) : headers?.[CLIENT_ADDRESS_HEADER];
  const value = Array.isArray(raw) ? raw[0] : raw;
  return value?.trim() || 'unknown';
}

const HOOKED = Symbol.for('kerfcast.clientAddressHook');

/** Wraps http.Server's emit so every request carries CLIENT_ADDRESS_HEADER from its socket. */
export function installClientAddressHook(trustedProxies: readonly string[]): void {
  const proto = http.Server.prototype as unknown as Record<symbol, unknown> & { emit: (event: string, ...args: unknown[]) => boolean };
  if (proto[HOOKED]) return;
  proto[HOOKED] = true;
  const emit = proto.emit;
  proto.emit = function patchedEmit(this: unknown, event: string, ...args: unknown[]) {
    if (event === 'request' || event === 'checkContinue' || event === 'checkExpectation') {
      const request = args[0] as http.IncomingMessage;
      request.headers[CLIENT_ADDRESS_HEADER] = resolveClientAddress(request.socket?.remoteAddress, request.headers['x-forwarded-for'], trustedProxies);
    }
    return emit.call(this, event, ...args);
  };
}
