/** How the board writes times, durations and distances. */

/** "07:30" from an ISO 8601 time written with the practice's offset (the plans API's times). */
export const clock = (iso: string) => iso.slice(11, 16);
/** Minutes as "45 min" or "1 h 05". */
export const hm = (minutes: number) => (minutes < 60 ? `${minutes} min` : `${Math.floor(minutes / 60)} h ${String(minutes % 60).padStart(2, '0')}`);
