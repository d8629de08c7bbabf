/**
 * The top of the day sheet: "Start the day" when leaving home and "Back home" at the end, each with an
 * optional odometer reading in the practice's units. These give the review the farrier's actual hours
 * and, with both readings, the measured distance (without them the review uses the planned route's
 * distance and says so). Shows what the phone has queued as well as what the server confirmed, so
 * the marks work in a dead spot like the stop marks do.
 */
import { useState } from 'react';
import type { DayLogView } from '../../lib/day-sheet/day-logs';
import { odometerProblem, MAX_DAY_ODOMETER_UNITS } from '../../lib/day-sheet/odometer';
import { unitLabel } from '../../lib/review/mileage';
import { dayView } from '../../lib/day-sheet/day-view';
import { odometerReading } from '../../schemas/day-logs';
import type { QueuedDayMark } from './mark-queue';

interface Props {
  confirmed: DayLogView | null;
  queued: QueuedDayMark[];
  /** Whether any stop has a mark (then the server has started the day at the planned departure). */
  anyStopMarked: boolean;
  firstStopPosition: number;
  plannedStartAt: string;
  plannedEndAt: string;
  plannedDistanceM: number;
  timeZone: string;
  units: 'miles' | 'km';
  canMark: boolean;
  onMark: (kind: 'start' | 'end', odometer: number | null) => void;
}

function clock(ms: number, timeZone: string): string {
  return new Intl.DateTimeFormat('en-US', { timeZone, hour: 'numeric', minute: '2-digit' }).format(new Date(ms)).replace(' AM', 'am').replace(' PM', 'pm');
}

function hoursText(sec: number): string {
  const min = Math.max(0, Math.round(sec / 60));
  return `${Math.floor(min / 60)} h ${String(min % 60).padStart(2, '0')} min`;
}

/** Reads what the farrier typed: digits, with spaces, commas or dots as thousands separators. */
function parseReading(text: string): { value: number | null; error: string | null } {
  const cleaned = text.trim().replace(/[\s,.]/g, '');
  if (!cleaned) return { value: null, error: null };
  if (!/^\d+$/.test(cleaned)) return { value: null, error: 'Whole miles or km, digits only' };
  const parsed = odometerReading.safeParse(Number(cleaned));
  return parsed.success ? { value: parsed.data, error: null } : { value: null, error: parsed.error.issues[0]?.message ?? 'Not a reading' };
}

export default function DayMarks(props: Props) {
  const { timeZone, units, canMark } = props;
  const u = unitLabel(units);
  const [reading, setReading] = useState('');
  const [error, setError] = useState<string | null>(null);
  const day = dayView(props);
  const state = !day ? 'not_started' : day.endedMs == null ? 'started' : 'ended';

  const submit = (kind: 'start' | 'end') => {
    const { value, error: problem } = parseReading(reading);
    if (problem) return setError(problem);
    if (kind === 'end' && day) {
      const p = odometerProblem(day.startOdometer, value);
      if (p === 'backwards') return setError(`Below this morning's ${day.startOdometer!.toLocaleString('en-US')} ${u}`);
      if (p === 'too_far') return setError(`More than ${MAX_DAY_ODOMETER_UNITS.toLocaleString('en-US')} ${u} since this morning: check the digits`);
    }
    setError(null);
    setReading('');
    props.onMark(kind, value);
  };

  const field = (label: string) => (
    <div className="mt-3">
      <label className="label" htmlFor="odometer">{label} <span className="font-normal text-slateblue-500">(optional)</span></label>
      <input
        id="odometer" name="odometer" className="field figure min-h-12 text-lg" inputMode="numeric" autoComplete="off" placeholder={`e.g. 48 215`}
        value={reading} onChange={(e) => { setReading(e.target.value); setError(null); }} aria-invalid={!!error} aria-describedby={error ? 'odometer-error' : undefined}
      />
      {error && <p id="odometer-error" className="field-error">{error}</p>}
    </div>
  );

  return (
    <section className="card mt-3 p-4" aria-label="Your day" data-testid="day-marks" data-day-state={state}>
      {state === 'not_started' && (
        <>
          <h2 className="text-xl font-bold">Leaving home?</h2>
          <p className="text-base text-slateblue-700">Planned departure <span className="figure font-semibold">{clock(Date.parse(props.plannedStartAt), timeZone)}</span></p>
          {canMark && (
            <form className="no-print" onSubmit={(e) => { e.preventDefault(); submit('start'); }}>
              {field(`Odometer leaving home (${u})`)}
              <button type="submit" className="btn-primary mt-3 min-h-14 w-full text-lg">Start the day</button>
            </form>
          )}
        </>
      )}
      {day && (
        <p className="text-base" data-testid="day-start">
          {day.startImplied ? (
            <>Day started <span className="figure font-semibold">{clock(day.startedMs, timeZone)}</span>, the planned departure: stop {props.firstStopPosition} was marked before Start the day.</>
          ) : (
            <>Left home <span className="figure font-semibold">{clock(day.startedMs, timeZone)}</span>{day.startOdometer != null && <> · odometer <span className="figure">{day.startOdometer.toLocaleString('en-US')} {u}</span></>}</>
          )}
          {day.waiting && <span className="ml-1 text-sm text-slateblue-600">(waiting to send)</span>}
        </p>
      )}
      {day && state === 'started' && canMark && (
        <form className="no-print" onSubmit={(e) => { e.preventDefault(); submit('end'); }}>
          {field(`Odometer back home (${u})`)}
          <button type="submit" className="btn-quiet mt-3 min-h-14 w-full text-lg">Back home</button>
          <p className="mt-1 text-sm text-slateblue-600">Planned home <span className="figure">{clock(Date.parse(props.plannedEndAt), timeZone)}</span></p>
        </form>
      )}
      {day && day.endedMs != null && (
        <div data-testid="day-end">
          <p className="text-base">
            Back home <span className="figure font-semibold">{clock(day.endedMs, timeZone)}</span>{day.endOdometer != null && <> · odometer <span className="figure">{day.endOdometer.toLocaleString('en-US')} {u}</span></>} ·{' '}
            <span className="figure">{hoursText((day.endedMs - day.startedMs) / 1000)}</span> out
          </p>
          {day.distanceM != null && (
            <p className="text-base text-slateblue-700">
              {day.distanceSource === 'odometer'
                ? <><span className="figure font-semibold">{Math.round(day.distanceM / (units === 'miles' ? 1609.344 : 1000)).toLocaleString('en-US')} {u}</span> by odometer</>
                : <><span className="figure font-semibold">{(day.distanceM / (units === 'miles' ? 1609.344 : 1000)).toFixed(1)} {u}</span> planned route (no odometer pair, so the review shows the planned distance)</>}
            </p>
          )}
        </div>
      )}
      <p className="mt-3 text-sm text-slateblue-700">Readings are optional. A mileage log for tax is your own record: keep it as you always do; these readings only let the practice's review show measured miles.</p>
      <p className="caution mt-2 text-base">Driving hours and tiredness: take your break, and pull over somewhere safe if you feel drowsy at the wheel. Local driving-time rules apply.</p>
    </section>
  );
}
