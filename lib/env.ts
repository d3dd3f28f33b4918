// The process environment, read and validated once. Every variable has a local default
// that matches scripts/services-start.sh, so a fresh checkout needs no .env file; see
// .env.example for what each one means in production. Server-only: never import this
// from a client component.
//
// Local mode: APP_URL on a loopback address, and NODE_ENV not "production" or
// KERFCAST_LOCAL=1 (set by scripts/start.sh and scripts/test.sh, which build and serve in
// production mode on loopback). Only local mode takes the defaults of the local services
// (DATABASE_URL with the install's password from .data/db-password, S3_*, SMTP_URL) and,
// without AUTH_SECRET, a random secret made once into .data/auth-secret. Anywhere else
// those must be set, and a server missing one refuses to start (ASVS 4.0.3 V2.10.4,
// V3.5.3, V14.1).
import { z } from '@/lib/validation/zod';
import { AUTH_SECRET_FILE, localDataDir, localDatabaseUrl, readOrCreateSecret } from '@/lib/local-secrets';

/** Never signs a token that is served: only `next build`, which serves nothing, gets it. */
const BUILD_ONLY_AUTH_SECRET = 'kerfcast-build-phase-placeholder-never-served';

/** Variables a deployment outside local mode must set (their defaults reach the local fakes). */
export const REQUIRED_OUTSIDE_LOCAL = ['DATABASE_URL', 'S3_ENDPOINT', 'S3_ACCESS_KEY_ID', 'S3_SECRET_ACCESS_KEY', 'SMTP_URL', 'AUTH_SECRET'] as const;

/** true for localhost, 127.0.0.0/8 and ::1 (RFC 6761 §6.3, RFC 1122 §3.2.1.3, RFC 4291 §2.5.3) */
export function isLoopbackHost(hostname: string): boolean {
  const host = hostname.replace(/^\[|\]$/g, '').toLowerCase();
  return host === 'localhost' || host.endsWith('.localhost') || host === '::1' || /^127\.\d{1,3}\.\d{1,3}\.\d{1,3}$/.test(host);
}

function isLoopbackUrl(value: string): boolean {
  try {
    return isLoopbackHost(new URL(value).hostname);
  } catch {
    return false;
  }
}

// The service ports of scripts/services-start.sh also move the matching URL defaults.
const portSchema = (fallback: number) => z.coerce.number().int().min(1).max(65535).default(fallback);

const url = (protocols: string[]) =>
  z.string().refine(
    (value) => {
      try {
        return protocols.includes(new URL(value).protocol);
      } catch {
        return false;
      }
    },
    { message: `must be a URL starting with ${protocols.map((p) => `${p}//`).join(' or ')}` },
  );

const portsSchema = z.object({
  KERFCAST_DB_PORT: portSchema(3307),
  KERFCAST_S3_PORT: portSchema(4569),
  KERFCAST_SMTP_PORT: portSchema(2525),
  KERFCAST_MAIL_HTTP_PORT: portSchema(8025),
});

const schemaFor = (p: z.infer<typeof portsSchema>) => z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  KERFCAST_LOCAL: z.enum(['0', '1', '']).default(''),
  DATABASE_URL: url(['mysql:']).optional(),
  S3_ENDPOINT: url(['http:', 'https:']).default(`http://127.0.0.1:${p.KERFCAST_S3_PORT}`),
  S3_REGION: z.string().min(1).default('us-east-1'),
  S3_BUCKET: z.string().min(3).max(63).default('kerfcast-programs'),
  S3_ACCESS_KEY_ID: z.string().min(1).default('S3RVER'),
  S3_SECRET_ACCESS_KEY: z.string().min(1).default('S3RVER'),
  /** path-style URLs (endpoint/bucket/key): needed by the local fake and most S3-compatible stores */
  S3_FORCE_PATH_STYLE: z.enum(['0', '1', 'true', 'false']).default('1'),
  SMTP_URL: url(['smtp:', 'smtps:']).default(`smtp://127.0.0.1:${p.KERFCAST_SMTP_PORT}`),
  MAIL_FROM: z.string().min(3).default('Kerfcast <no-reply@kerfcast.example>'),
  /** where captured mail can be read; only the local SMTP fake has it */
  MAIL_CAPTURE_URL: url(['http:', 'https:']).default(`http://127.0.0.1:${p.KERFCAST_MAIL_HTTP_PORT}`),
  APP_URL: url(['http:', 'https:']).default('http://127.0.0.1:3000'),
  AUTH_SECRET: z.string().min(16, 'must be at least 16 characters').optional(),
  /**
   * Addresses (comma-separated) of reverse proxies whose X-Forwarded-For is believed;
   * unset: the client address is the connection's (lib/http/client-address.ts)
   */
  TRUSTED_PROXY: z
    .string()
    .optional()
    .transform((v) => (v ?? '').split(',').map((a) => a.trim()).filter(Boolean))
    .pipe(z.array(z.union([z.ipv4(), z.ipv6()], { error: 'must be IP addresses, comma-separated' }))),
  /** a session ends after this many minutes without a request (ASVS V3.3.2) */
  SESSION_IDLE_MINUTES: z.coerce.number().int().min(1).max(24 * 60).default(30),
  /** and at the latest this many hours after sign-in, however active (ASVS V3.3.1) */
  SESSION_MAX_HOURS: z.coerce.number().int().min(1).max(7 * 24).default(12),
  /** largest JSON request body a route handler reads; more answers 413 (lib/http/route.ts) */
  JSON_BODY_LIMIT_BYTES: z.coerce.number().int().min(1024).max(64 * 1024 * 1024).default(1024 * 1024),
  /** largest G-code file an upload takes; more answers 413 (lib/programs/upload.ts) */
  PROGRAM_MAX_BYTES: z.coerce.number().int().min(1024).max(4 * 1024 * 1024 * 1024).default(100 * 1024 * 1024),
  /** worker threads that compute estimates; unset: the number of cores minus one, at least one */
  ESTIMATE_POOL_SIZE: z.coerce.number().int().min(1).max(64).optional(),
  /**
   * how long a claimed estimate stays with its process without a renewal (renewed every third
   * of it while the work runs); a process that dies leaves its rows to others after this
   */
  ESTIMATE_LEASE_SECONDS: z.coerce.number().int().min(3).max(3600).default(30),
});

export type Env = Omit<z.infer<ReturnType<typeof schemaFor>>, 'AUTH_SECRET' | 'S3_FORCE_PATH_STYLE' | 'DATABASE_URL'> & {
  DATABASE_URL: string;
  AUTH_SECRET: string;
  S3_FORCE_PATH_STYLE: boolean;
  /** true when the local services' defaults and the generated local secret may be used */
  isLocal: boolean;
};

export function parseEnv(source: Record<string, string | undefined>): Env {
  // Empty strings count as unset, so `FOO=` in a .env file falls back to the default.
  const cleaned = Object.fromEntries(Object.entries(source).filter(([, v]) => v !== undefined && v !== ''));
  const ports = portsSchema.safeParse(cleaned);
  const result = ports.success ? schemaFor(ports.data).safeParse(cleaned) : ports;
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join('.') || '(env)'}: ${i.message}`);
    throw new Error(`Invalid environment (see .env.example):\n${lines.join('\n')}`);
  }
  const parsed = result.data as z.infer<ReturnType<typeof schemaFor>>;
  const isLocal = isLoopbackUrl(parsed.APP_URL) && (parsed.NODE_ENV !== 'production' || parsed.KERFCAST_LOCAL === '1');
  // `next build` loads server modules to collect page data but serves no request, so a
  // missing setting is only an error when the server really starts.
  const building = source.NEXT_PHASE === 'phase-production-build';
  if (!isLocal && !building) {
    const missing = REQUIRED_OUTSIDE_LOCAL.filter((name) => !cleaned[name]);
    if (missing.length > 0) {
      const why = isLoopbackUrl(parsed.APP_URL) ? 'required in production' : `required when APP_URL (${parsed.APP_URL}) is not a loopback address`;
      const hint: Record<string, string> = { AUTH_SECRET: ' (openssl rand -base64 32)' };
      throw new Error(`Invalid environment (see .env.example):\n${missing.map((m) => `  ${m}: ${why}${hint[m] ?? ''}`).join('\n')}`);
    }
  }
  const authSecret =
    parsed.AUTH_SECRET ?? (isLocal ? readOrCreateSecret(localDataDir(cleaned), AUTH_SECRET_FILE) : BUILD_ONLY_AUTH_SECRET);
  return {
    ...parsed,
    DATABASE_URL: parsed.DATABASE_URL ?? localDatabaseUrl('kerfcast', { ...cleaned, KERFCAST_DB_PORT: String(ports.success ? ports.data.KERFCAST_DB_PORT : 3307) }),
    AUTH_SECRET: authSecret,
    S3_FORCE_PATH_STYLE: parsed.S3_FORCE_PATH_STYLE === '1' || parsed.S3_FORCE_PATH_STYLE === 'true',
    isLocal,
  };
}

export const env: Env = parseEnv(process.env);
