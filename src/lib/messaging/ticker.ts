/**
 * Sends due texts every 30 seconds inside the app's server process, so that texts held back by quiet
 * hours go at 08:00 without anyone publishing again. Started on first use by the messaging endpoints
 * and pages; calling it again does nothing.
 */
import { db } from '../server/db.ts';
import { sendDueMessages } from './arrival-texts.ts';

let timer: ReturnType<typeof setInterval> | null = null;
let running = false;

export function ensureMessageTicker(intervalMs = 30_000): void {
  if (timer || process.env.ROUNDSMITH_NO_TICKER) return;
  timer = setInterval(() => {
    if (running) return;
    running = true;
    sendDueMessages(db(), new Date())
      .catch((e: unknown) => {
        console.error('[texts] sending due texts failed:', e instanceof Error ? e.message : e);
      })
      .finally(() => {
        running = false;
      });
  }, intervalMs);
  timer.unref?.();
}
