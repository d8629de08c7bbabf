/**
 * Keeping the day sheet on the phone for a dead spot (see public/day-sheet-sw.js). The worker keeps
 * every day-sheet page, built file and map tile that passes through it; these helpers make sure the
 * first visit is kept too (the page that registers the worker loaded before the worker was there)
 * and that the kept copy follows the marks the server has confirmed.
 */

/** The cache the worker keeps day-sheet pages in (its PAGES constant). */
export const KEPT_PAGES = 'roundsmith-day-pages-v1';

/** Registers the worker for /day and, once it controls this page, passes the page and its files through it. */
export async function keepDaySheetOffline(): Promise<void> {
  if (!('serviceWorker' in navigator)) return;
  try {
    await navigator.serviceWorker.register('/day-sheet-sw.js', { scope: '/day' });
    if (!navigator.serviceWorker.controller) {
      await new Promise<void>((resolve) => navigator.serviceWorker.addEventListener('controllerchange', () => resolve(), { once: true }));
    }
    const files = performance.getEntriesByType('resource').map((e) => e.name).filter((u) => {
      const url = new URL(u);
      return url.origin === location.origin && (url.pathname.startsWith('/_astro/') || url.pathname.startsWith('/tiles/'));
    });
    await Promise.all([refreshKeptCopy(), ...files.map((u) => fetch(u, { credentials: 'same-origin' }).catch(() => undefined))]);
  } catch {
    // No worker (private mode, blocked storage): the page still works while there is a signal.
  }
}

/** Fetches this page again through the worker, so the copy it keeps shows what the server now holds. */
export async function refreshKeptCopy(): Promise<void> {
  if (!('serviceWorker' in navigator) || !navigator.serviceWorker.controller) return;
  await fetch(location.href, { credentials: 'same-origin', headers: { accept: 'text/html' } }).catch(() => undefined);
}

/** Deletes the kept day sheets (on the sign-in page: the next person on a shared phone must not see them). */
export async function forgetKeptDaySheets(): Promise<void> {
  if ('caches' in window) await caches.delete(KEPT_PAGES).catch(() => false);
}
