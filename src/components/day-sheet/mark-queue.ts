/**
 * The day sheet's offline queue of marks, kept in localStorage so that a mark survives a dead spot,
 * a closed tab and a reload. Each mark has a random key made once on the phone; the server treats a
 * second delivery of that key as a replay, so sending the queue again can never double a mark. Stop
 * marks (arrived, done, skipped) and day marks (Start the day, Back home) share one queue, sent in
 * the order they were made, so a start always reaches the server before the stops and the end.
 */

export interface QueuedStopMark {
  clientKey: string;
  stopId: number;
  state: 'arrived' | 'done' | 'skipped';
  at: string;
  skipReason?: string | null;
}

/** "Start the day" (leaving home) or "Back home", with the odometer in whole miles or km if given. */
export interface QueuedDayMark {
  clientKey: string;
  kind: 'start' | 'end';
  date: string;
  farrierId: number;
  at: string;
  odometer?: number | null;
}

export type QueuedMark = QueuedStopMark | QueuedDayMark;

const KEY = 'roundsmith.day-sheet.marks.v1';

/** Day marks carry a kind; queue entries stored before day marks existed are stop marks. */
export function isDayMark(mark: QueuedMark): mark is QueuedDayMark {
  return 'kind' in mark && (mark.kind === 'start' || mark.kind === 'end');
}

/** A 32-character random key (hex), from the browser's crypto (works on plain http too). */
export function newClientKey(): string {
  const bytes = new Uint8Array(16);
  crypto.getRandomValues(bytes);
  return Array.from(bytes, (b) => b.toString(16).padStart(2, '0')).join('');
}

export function readQueue(): QueuedMark[] {
  try {
    const raw = localStorage.getItem(KEY);
    const list = raw ? (JSON.parse(raw) as unknown) : [];
    return Array.isArray(list) ? (list as QueuedMark[]) : [];
  } catch {
    return [];
  }
}

export function writeQueue(list: QueuedMark[]): void {
  try {
    localStorage.setItem(KEY, JSON.stringify(list));
  } catch {
    // Storage full or blocked: the marks stay in memory for this page.
  }
}

export type SendOutcome = { ok: true; body: unknown } | { ok: false; retry: boolean; message: string };

/** Sends one mark; a network failure or a 5xx is worth retrying, a 4xx is not. */
export async function sendMark(mark: QueuedMark): Promise<SendOutcome> {
  let response: Response;
  try {
    response = await fetch(isDayMark(mark) ? '/api/day-logs' : '/api/visits', {
      method: 'POST',
      headers: { 'content-type': 'application/json', accept: 'application/json' },
      credentials: 'same-origin',
      body: JSON.stringify(mark),
    });
  } catch {
    return { ok: false, retry: true, message: 'No connection' };
  }
  if (response.ok) {
    let body: unknown = null;
    try {
      body = await response.json();
    } catch {
      // an empty answer is still a success
    }
    return { ok: true, body };
  }
  let message = `The server answered ${response.status}`;
  try {
    const body = (await response.json()) as { error?: { message?: string } };
    if (body.error?.message) message = body.error.message;
  } catch {
    // keep the status message
  }
  return { ok: false, retry: response.status >= 500 || response.status === 401, message };
}
