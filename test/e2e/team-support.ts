/**
 * Helpers for the team's browser tests: signing in through the development identity provider's
 * own page, as a person would, and reading figures off the bench.
 */
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { DEMO_PASSWORD } from '../../api/services/seed';
import { RESULTS_DIR } from '../support/browser';

/** From the app's sign-in page, through the provider's form, back to `next`. */
export async function signInThroughPage(page: Page, baseUrl: string, email: string, next = '/bench'): Promise<void> {
  await page.goto(`${baseUrl}/sign-in?next=${encodeURIComponent(next)}`);
  await page.getByRole('main').getByRole('link', { name: 'Sign in' }).click();
  await fillProviderForm(page, email);
  await page.waitForURL((url) => url.pathname === next.split('?')[0], { timeout: 20_000 });
}

/** The provider's page: fields `email` and `password`. */
export async function fillProviderForm(page: Page, email: string): Promise<void> {
  await page.locator('input[name=email]').waitFor();
  await page.fill('input[name=email]', email);
  await page.fill('input[name=password]', DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/** The CMRR figure in dB as the Modes panel writes it (e.g. "64.6 dB"). */
export async function cmrrFigure(page: Page): Promise<string> {
  await page.getByRole('tab', { name: 'Modes' }).click();
  const big = page.locator('nw-modes-panel section[aria-label="CMRR"] .big');
  await big.waitFor();
  return ((await big.textContent()) ?? '').trim();
}

/** Screenshots at the two sizes we design for (1280×800 and 1920×1080), then back to 1280×800. */
export async function shotBoth(page: Page, name: string): Promise<void> {
  await page.setViewportSize({ width: 1280, height: 800 });
  await page.screenshot({ path: join(RESULTS_DIR, `${name}-1280.png`) });
  await page.setViewportSize({ width: 1920, height: 1080 });
  await page.waitForTimeout(150);
  await page.screenshot({ path: join(RESULTS_DIR, `${name}-1920.png`) });
  await page.setViewportSize({ width: 1280, height: 800 });
}
