/** HTTP helpers for tests that talk to the built app started by scripts/test.mjs. */
export const APP_URL = process.env.APP_URL ?? '';
export const DEMO_PASSWORD = 'roundsmith-demo';

if (!APP_URL) throw new Error('APP_URL is not set: run integration tests through `npm test`');

/** Signs in over the JSON API and returns the Cookie header value of the new session. */
export async function sessionCookie(email: string, password = DEMO_PASSWORD): Promise<string> {
  const response = await fetch(`${APP_URL}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  if (response.status !== 200) throw new Error(`sign-in of ${email} answered ${response.status}`);
  const setCookie = response.headers.get('set-cookie') ?? '';
  const match = /rs_session=([^;]+)/.exec(setCookie);
  if (!match) throw new Error('no session cookie');
  return `rs_session=${match[1]}`;
}

/** A JSON request; returns status and parsed body (null when empty). */
export async function call(
  method: string,
  path: string,
  options: { cookie?: string; body?: unknown; rawBody?: string; contentType?: string } = {},
): Promise<{ status: number; body: any; headers: Headers }> {
  // Same-origin, as a browser would send it: Astro's origin check refuses form-like posts without it.
  const headers: Record<string, string> = { origin: APP_URL };
  if (options.cookie) headers.cookie = options.cookie;
  let body: string | undefined;
  if (options.rawBody !== undefined) {
    body = options.rawBody;
    headers['content-type'] = options.contentType ?? 'application/json';
  } else if (options.body !== undefined) {
    body = JSON.stringify(options.body);
    headers['content-type'] = 'application/json';
  }
  const response = await fetch(`${APP_URL}${path}`, { method, headers, body, redirect: 'manual' });
  const text = await response.text();
  let parsed: unknown = null;
  try {
    parsed = text ? JSON.parse(text) : null;
  } catch {
    parsed = text;
  }
  return { status: response.status, body: parsed, headers: response.headers };
}
