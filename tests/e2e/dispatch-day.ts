import { afterAll, beforeAll } from 'vitest';
import type { Knex } from 'knex';
import type { Page, Response } from 'playwright-core';
import { APP_URL, hydrated, launch, signIn } from './browser.ts';
import { appDatabase } from '../integration/helpers/db.ts';
import { clearPlan, dispatchTestDate } from '../integration/dispatch/dates.ts';

type Session = Awaited<ReturnType<typeof launch>>;

/**
 * The set-up every dispatch browser test shares: a plan date of the file's own (the n-th
 * Monday–Thursday after today, cleared of an earlier run's plan), the app's database and a browser,
 * closed again after the file's tests. Read `knex` and `browser` inside tests, after the set-up ran.
 */
export function dispatchBrowserDay(n: Parameters<typeof dispatchTestDate>[1], viewport = { width: 1500, height: 1000 }) {
  const day = { date: dispatchTestDate('America/New_York', n), knex: null as unknown as Knex, browser: null as unknown as Session };
  beforeAll(async () => {
    day.knex = appDatabase();
    await clearPlan(day.knex, 1, day.date);
    day.browser = await launch({ viewport });
  });
  afterAll(async () => {
    await day.browser?.close();
    await day.knex?.destroy();
  });
  return day;
}

/** Signs the demo dispatcher in and opens the dispatch screen on `date`, its islands hydrated. */
export async function openDispatch(page: Page, date: string): Promise<void> {
  await signIn(page, 'dispatcher@demo.test');
  await page.goto(`${APP_URL}/dispatch?date=${date}`);
  await hydrated(page);
}

/** The board's farrier lanes, left to right (the unplanned lane left out). */
export async function farrierLanes(page: Page): Promise<string[]> {
  return (await page.$$eval('[data-lane]', (els) => els.map((e) => e.getAttribute('data-lane')!))).filter((l) => l !== 'unplanned');
}

/**
 * Drags the focused card with the keyboard: lift with Space, one arrow key, drop with Space. dnd-kit
 * settles the lifted card and the new drop target between key presses. Answers the PATCH it sends.
 */
export async function keyboardDrag(page: Page, key: 'ArrowLeft' | 'ArrowRight', timeout?: number): Promise<Response> {
  const patch = page.waitForResponse((r) => r.request().method() === 'PATCH' && r.url().includes('/api/plans/'), timeout === undefined ? {} : { timeout });
  await page.keyboard.press('Space');
  await page.waitForTimeout(300);
  await page.keyboard.press(key);
  await page.waitForTimeout(300);
  await page.keyboard.press('Space');
  return patch;
}
