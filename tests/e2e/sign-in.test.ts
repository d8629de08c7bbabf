import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, signIn, screenshot, APP_URL } from './browser.ts';

type Session = Awaited<ReturnType<typeof launch>>;

/** What each role's navigation must and must not offer. */
const ROLES: [string, string[], string[]][] = [
  ['lead@demo.test', ['Dispatch', 'Team', 'Review', 'Settings'], []],
  ['dispatcher@demo.test', ['Dispatch', 'Barns', 'Messages'], ['Team', 'Review', 'Settings']],
  ['farrier1@demo.test', ['Day sheet'], ['Dispatch', 'Team', 'Settings', 'Messages']],
  ['dispatcher@other.test', ['Dispatch'], ['Team', 'Settings']],
];

describe('signing in in a real browser', () => {
  let browser: Session;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser.close();
  });

  it.each(ROLES)('%s signs in and sees the navigation of their role', async (email, shown, hidden) => {
    await browser.context.clearCookies();
    await signIn(browser.page, email);
    const nav = browser.page.locator('nav[aria-label=Main]');
    const text = await nav.innerText();
    for (const label of shown) expect(text).toContain(label);
    for (const label of hidden) expect(text).not.toContain(label);
    await screenshot(browser.page, `home-${email.replace(/[@.]/g, '-')}`);
    await browser.page.click('text=Sign out');
    await browser.page.waitForURL(/\/sign-in/);
  });

  it('shows a plain error for a wrong password and stays on the sign-in page', async () => {
    await browser.context.clearCookies();
    await browser.page.goto(`${APP_URL}/sign-in`);
    await browser.page.fill('#email', 'lead@demo.test');
    await browser.page.fill('#password', 'definitely-wrong');
    await browser.page.click('button[type=submit]');
    await browser.page.waitForSelector('[role=alert]');
    expect(await browser.page.locator('[role=alert]').innerText()).toMatch(/not right/);
    expect(new URL(browser.page.url()).pathname).toBe('/sign-in');
    await screenshot(browser.page, 'sign-in-wrong-password');
  });

  it('lets the lead save a setting through the settings form and shows field errors from the server', async () => {
    await browser.context.clearCookies();
    await signIn(browser.page, 'lead@other.test');
    await browser.page.goto(`${APP_URL}/settings`);
    await browser.page.waitForFunction(() => document.querySelectorAll('astro-island[ssr]').length === 0);
    await browser.page.fill('#timeZone', 'Nowhere/Atlantis');
    await browser.page.click('text=Save settings');
    await browser.page.waitForSelector('#timeZone ~ .field-error, .field-error');
    expect(await browser.page.locator('.field-error').first().innerText()).toMatch(/time zone/i);
    await browser.page.fill('#timeZone', 'America/New_York');
    await browser.page.fill('#mileageRate', '0.67');
    await browser.page.click('text=Save settings');
    await browser.page.waitForSelector('text=Settings saved.');
    await screenshot(browser.page, 'settings');
  });
});
