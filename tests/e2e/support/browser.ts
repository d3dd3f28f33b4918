// Debian's Chromium driven by playwright-core: headless, no sandbox (containers run
// as root), nothing phoning home, and a fresh profile folder per launch so no cookie
// survives from one run to the next.
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext } from 'playwright-core';

export const CHROMIUM_PATH = process.env.KERFCAST_CHROMIUM ?? '/usr/bin/chromium';
const ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
];

export interface BrowserSession {
  context: BrowserContext;
  close(): Promise<void>;
}

export async function launchBrowser(): Promise<BrowserSession> {
  const userDataDir = mkdtempSync(path.join(os.tmpdir(), 'kerfcast-e2e-'));
  const context = await chromium.launchPersistentContext(userDataDir, {
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: ARGS,
    viewport: { width: 1366, height: 900 },
  });
  // generous: a server action hashes a password with bcrypt on a small, busy machine
  context.setDefaultTimeout(45_000);
  return {
    context,
    async close() {
      await context.close();
      rmSync(userDataDir, { recursive: true, force: true });
    },
  };
}
