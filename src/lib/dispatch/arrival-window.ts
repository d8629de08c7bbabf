import type { Knex } from 'knex';
import { arrivalWindow as messagingWindow, type ArrivalWindow } from '../messaging/arrival-window.ts';
import { getTextSettings, windowSettingsOf } from '../messaging/text-settings.ts';
import type { WindowSettings } from '../messaging/arrival-window.ts';

/**
 * Each stop's arrival window, as the board shows it and the owner is told. There is one rule in
 * Roundsmith, the messaging module's (rounded planned arrival, centred window that widens with the
 * stop's place in the route, within the practice's text settings); dispatch computes it here for every
 * stop of a draft so the card shows the window before publishing, and publishing writes the same
 * window again when it queues the texts.
 */
export type { ArrivalWindow, WindowSettings };

/** The practice's window settings (minimum width, growth per stop, maximum). */
export async function windowSettings(db: Knex | Knex.Transaction, practiceId: number): Promise<WindowSettings> {
  return windowSettingsOf(await getTextSettings(db, practiceId));
}

/** The arrival window of the stop at 1-based `position` with planned arrival `arrivalAt`. */
export function stopArrivalWindow(arrivalAt: Date, position: number, settings: WindowSettings): ArrivalWindow {
  return messagingWindow(arrivalAt, position, settings);
}
