/**
 * Debian's chromium driven by playwright-core: never a downloaded browser.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { chromium, type BrowserContext } from 'playwright-core';
import { ROOT } from '../../tools/postgres';

export const CHROMIUM = process.env.NODEWRIGHT_CHROMIUM ?? '/usr/bin/chromium';
export const RESULTS_DIR = join(ROOT, 'test-results');

/** Installs Debian's chromium with apt-get when missing (as root), else explains how. */
export function ensureChromium(): void {
  if (existsSync(CHROMIUM)) return;
  if (process.getuid?.() !== 0) throw new Error(`Chromium not found at ${CHROMIUM}. Install it with: sudo apt-get update && sudo apt-get install -y chromium`);
  console.log('Installing Debian\'s chromium for the browser tests…');
  const r = spawnSync('sh', ['-c', 'apt-get update -qq && apt-get install -y -qq chromium'], { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
  if (r.status !== 0 || !existsSync(CHROMIUM)) throw new Error('Installing chromium with apt-get failed.');
}

export interface Browser {
  context: BrowserContext;
  close(): Promise<void>;
}

/** A fresh headless profile; closing removes it. */
export async function launchBrowser(): Promise<Browser> {
  const tmp = join(ROOT, '.tmp');
  mkdirSync(tmp, { recursive: true });
  mkdirSync(RESULTS_DIR, { recursive: true });
  const profile = mkdtempSync(join(tmp, 'chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    viewport: { width: 1280, height: 800 },
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
      '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage'],
  });
  return {
    context,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}
