import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

/** The built app that scripts/test.mjs started for this run. */
export const APP_URL = process.env.APP_URL ?? '';
export const DEMO_PASSWORD = 'roundsmith-demo';

/**
 * Launches Debian's chromium headless with a fresh profile. Background traffic is switched off and a
 * proxy on a closed local port catches anything the browser itself would send elsewhere, so no
 * request can leave this machine; WebGL runs through SwiftShader for the map.
 */
export async function launch(options: { viewport?: { width: number; height: number }; isMobile?: boolean } = {}) {
  const dir = mkdtempSync(path.join(tmpdir(), 'roundsmith-chromium-'));
  const context: BrowserContext = await chromium.launchPersistentContext(dir, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    viewport: options.viewport ?? { width: 1400, height: 900 },
    isMobile: options.isMobile,
    hasTouch: options.isMobile,
    args: [
      '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync',
      '--enable-unsafe-swiftshader', '--proxy-server=http://127.0.0.1:9',
    ],
  });
  const page = context.pages()[0] ?? (await context.newPage());
  return {
    context,
    page,
    async close() {
      await context.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** Signs in through the sign-in form and waits for the home page. */
export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto(`${APP_URL}/sign-in`);
  await page.fill('#email', email);
  await page.fill('#password', password);
  await Promise.all([page.waitForURL((url) => !url.pathname.startsWith('/sign-in')), page.click('button[type=submit]')]);
}

/** Waits until every island on the page has hydrated, so clicks reach React. */
export async function hydrated(page: Page): Promise<void> {
  await page.waitForFunction(() => document.querySelectorAll('astro-island[ssr]').length === 0);
}

/** A screenshot under .data/screenshots, for people to look at after a run. */
export async function screenshot(page: Page, name: string): Promise<string> {
  const file = path.resolve('.data', 'screenshots', `${name}.png`);
  await page.screenshot({ path: file, fullPage: false });
  return file;
}
