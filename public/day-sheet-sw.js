/**
 * The day sheet's service worker (scope /day): lets a farrier reopen the day sheet where there is no
 * signal, after the tab was closed or the phone reloaded it. It controls day-sheet pages only.
 *
 * - A day sheet (GET /day/…) comes from the network when it can, and each good answer is kept; with no
 *   connection the kept copy is served, or a short page saying this day was not opened here before.
 *   The day sheet fetches itself again after its marks reach the server, so the kept copy shows them.
 * - The app's built files (/_astro/…, content-hashed) are kept the first time they load.
 * - Map tiles, glyphs and style (/tiles/…) come from the network when they can and are kept, up to
 *   MAX_TILES entries, so the small route map draws from what the phone saw.
 *
 * Marks made offline are not this worker's job: the page queues them in localStorage and sends them
 * when the signal is back. The sign-in page deletes the kept day sheets, so the next person to sign in
 * on a shared phone cannot open them.
 */
const PAGES = 'roundsmith-day-pages-v1';
const ASSETS = 'roundsmith-day-assets-v1';
const TILES = 'roundsmith-day-tiles-v1';
const MAX_TILES = 800;

self.addEventListener('install', () => {
  self.skipWaiting();
});

self.addEventListener('activate', (event) => {
  event.waitUntil((async () => {
    const current = new Set([PAGES, ASSETS, TILES]);
    for (const key of await caches.keys()) if (key.startsWith('roundsmith-day-') && !current.has(key)) await caches.delete(key);
    await self.clients.claim();
  })());
});

self.addEventListener('fetch', (event) => {
  const request = event.request;
  const url = new URL(request.url);
  if (url.origin !== self.location.origin) return;
  if (request.method !== 'GET') event.respondWith(fetch(request));
  else if (url.pathname === '/day' || url.pathname.startsWith('/day/')) event.respondWith(page(request, url));
  else if (url.pathname.startsWith('/_astro/')) event.respondWith(asset(request));
  else if (url.pathname.startsWith('/tiles/')) event.respondWith(tile(request));
  // everything else (marks, day logs) passes straight through, so that it fails as the page's own
  // request would where there is no signal, and the page's queue keeps the mark
  else event.respondWith(fetch(request));
});

/**
 * Network first; a good answer (not a redirect to sign-in, not an error) replaces the kept copy. With
 * no connection, /day ("today") goes to the kept sheet of the phone's date, or else the last one kept.
 */
async function page(request, url) {
  const cache = await caches.open(PAGES);
  try {
    const response = await fetch(request);
    if (response.ok && !response.redirected && (response.headers.get('content-type') ?? '').includes('text/html')) {
      await cache.put(request.url, response.clone());
    }
    return response;
  } catch {
    const kept = await cache.match(request.url);
    if (kept) return kept;
    if (url.pathname === '/day' || url.pathname === '/day/') {
      const keys = await cache.keys();
      const d = new Date();
      const today = `/day/${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
      const same = keys.filter((k) => new URL(k.url).search === url.search);
      const pick = same.find((k) => new URL(k.url).pathname === today) ?? same[same.length - 1];
      if (pick) return Response.redirect(pick.url, 302);
    }
    return offlinePage();
  }
}

async function asset(request) {
  const cache = await caches.open(ASSETS);
  const kept = await cache.match(request);
  if (kept) return kept;
  const response = await fetch(request);
  if (response.ok) await cache.put(request, response.clone());
  return response;
}

async function tile(request) {
  const cache = await caches.open(TILES);
  try {
    const response = await fetch(request);
    if (response.ok) {
      await cache.put(request, response.clone());
      const keys = await cache.keys();
      for (const old of keys.slice(0, Math.max(0, keys.length - MAX_TILES))) await cache.delete(old);
    }
    return response;
  } catch {
    return (await cache.match(request)) ?? Response.error();
  }
}

function offlinePage() {
  const body = '<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>No signal · Roundsmith</title></head>'
    + '<body style="font: 18px/1.5 system-ui, sans-serif; margin: 2rem; color: #1f2a44"><h1 style="font-size: 1.5rem">No signal</h1>'
    + '<p>This day sheet was not opened on this phone while it had a connection, so there is no copy to show.</p>'
    + '<p>Open it again when you are back in range. Marks you already made are kept on the phone and sent then.</p></body></html>';
  return new Response(body, { status: 503, headers: { 'content-type': 'text/html; charset=utf-8' } });
}
