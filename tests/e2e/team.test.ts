import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, signIn, hydrated, screenshot, APP_URL } from './browser.ts';

type Session = Awaited<ReturnType<typeof launch>>;

describe('the lead invites a person and the invitation sets their password', () => {
  let browser: Session;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser.close();
  });

  it('invites from the Team page, shows the mail in the development outbox, and the link signs the person up', async () => {
    const { page, context } = browser;
    const email = `e2e-invite-${Date.now()}@demo.test`;
    await signIn(page, 'lead@demo.test');
    await page.goto(`${APP_URL}/team`);
    await hydrated(page);
    await page.waitForSelector('table');
    // A bad address is refused beside its field, before anything is sent.
    await page.fill('#invite-name', 'Juniper Ashcombe');
    await page.fill('#invite-email', 'not-an-address');
    await page.click('text=Send invitation');
    expect(await page.locator('#invite-email-error').innerText()).toMatch(/e-mail/i);
    await page.fill('#invite-email', email);
    await page.selectOption('#invite-role', 'dispatcher');
    await page.click('text=Send invitation');
    await page.waitForSelector(`text=Invitation e-mailed to ${email}.`);
    await page.waitForSelector(`li:has-text("${email}")`);
    await screenshot(page, 'team');
    // Deactivating and reactivating an account from the table.
    const row = page.locator('tr', { hasText: 'farrier6@demo.test' });
    await row.locator('text=Deactivate').click();
    await row.locator('text=deactivated').waitFor();
    await row.locator('text=Reactivate').click();
    await row.locator('td', { hasText: /^active$/ }).waitFor();

    await page.goto(`${APP_URL}/dev/outbox`);
    const card = page.locator('li', { hasText: email }).first();
    await card.waitFor();
    const text = await card.innerText();
    const link = /(http\S+\/invite\/\S+)/.exec(text)![1]!;
    await screenshot(page, 'dev-outbox');

    await context.clearCookies();
    await page.goto(link.replace(/^http:\/\/[^/]+/, APP_URL));
    await hydrated(page);
    await page.fill('#password', 'juniper-password-1');
    await page.fill('#repeat', 'juniper-password-1');
    await page.click('text=Set password');
    await page.waitForSelector('text=Your password is set.');
    await screenshot(page, 'invite-accepted');
    await signIn(page, email, 'juniper-password-1');
    expect(await page.locator('nav[aria-label=Main]').innerText()).toContain('Dispatch');
  });
});
