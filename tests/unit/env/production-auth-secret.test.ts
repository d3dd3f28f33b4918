// parseEnv in production without AUTH_SECRET (issue 19 point 6): a production server on a
// loopback APP_URL, without KERFCAST_LOCAL=1, is not local mode, so it must not sign
// sessions with a made-up or stored local secret; it refuses to start and names the
// variable. Only `next build` (NEXT_PHASE=phase-production-build), which serves nothing,
// passes without one. The rule: OWASP ASVS 4.0.3 V2.10.4 (no default secrets) and V3.5.3
// (tokens signed with a secret only the server holds); .env.example documents the variable.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { parseEnv } from '@/lib/env';

const dirs: string[] = [];
function dataDir(): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'kerfcast-env-prod-'));
  dirs.push(dir);
  return dir;
}
afterEach(() => {
  for (const dir of dirs.splice(0)) fs.rmSync(dir, { recursive: true, force: true });
});

// every other variable a deployment must set is set; APP_URL stays at its loopback default
const deployment = (dir: string) => ({
  NODE_ENV: 'production',
  KERFCAST_DATA_DIR: dir,
  DATABASE_URL: 'mysql://app:pw@db.internal:3306/kerfcast',
  S3_ENDPOINT: 'https://s3.internal',
  S3_ACCESS_KEY_ID: 'id',
  S3_SECRET_ACCESS_KEY: 'secret',
  SMTP_URL: 'smtp://mail.internal:587',
});

function failure(source: Record<string, string>): string {
  try {
    parseEnv(source);
  } catch (error) {
    return (error as Error).message;
  }
  return '';
}

describe('production without AUTH_SECRET', () => {
  it('refuses to start, naming AUTH_SECRET alone, and writes no local secret', () => {
    const dir = dataDir();
    const message = failure(deployment(dir));
    expect(message).toMatch(/^Invalid environment/);
    expect(message).toMatch(/\n {2}AUTH_SECRET: required in production/);
    // the other required variables are set, so they are not listed
    expect(message.split('\n').filter((l) => /^ {2}\w+:/.test(l))).toHaveLength(1);
    expect(fs.existsSync(path.join(dir, 'auth-secret'))).toBe(false);
  });

  it('an empty AUTH_SECRET= line counts as unset', () => {
    expect(failure({ ...deployment(dataDir()), AUTH_SECRET: '' })).toMatch(/AUTH_SECRET: required in production/);
  });

  it('a secret of 15 characters is refused as too short; 16 are taken', () => {
    expect(failure({ ...deployment(dataDir()), AUTH_SECRET: 'x'.repeat(15) })).toMatch(/AUTH_SECRET: must be at least 16 characters/);
    expect(parseEnv({ ...deployment(dataDir()), AUTH_SECRET: 'y'.repeat(16) }).AUTH_SECRET).toBe('y'.repeat(16));
  });

  it('a secret left in the state folder by local runs is not picked up in production', () => {
    const dir = dataDir();
    fs.writeFileSync(path.join(dir, 'auth-secret'), 'left-by-a-local-run-0123456789\n', { mode: 0o600 });
    expect(failure(deployment(dir))).toMatch(/AUTH_SECRET: required in production/);
  });

  it('`next build` passes without one, and stores none', () => {
    const dir = dataDir();
    const env = parseEnv({ ...deployment(dir), NEXT_PHASE: 'phase-production-build' });
    expect(env.isLocal).toBe(false);
    expect(env.AUTH_SECRET.length).toBeGreaterThanOrEqual(16);
    expect(fs.existsSync(path.join(dir, 'auth-secret'))).toBe(false);
  });
});
