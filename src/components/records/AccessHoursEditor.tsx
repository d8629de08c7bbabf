import type { AccessHours } from '../../schemas/barns.ts';
import { hhmm, parseHhmm, WEEKDAYS } from './format.ts';

/** Opening spans per weekday, Monday first; a day without spans is closed. */
export default function AccessHoursEditor({ value, onChange, errors }: { value: AccessHours; onChange: (v: AccessHours) => void; errors: Record<string, string> }) {
  const setDay = (day: number, spans: [number, number][]) => onChange(value.map((d, i) => (i === day ? spans : d)));
  return (
    <fieldset className="space-y-2">
      <legend className="label">Access hours (local time)</legend>
      {WEEKDAYS.map((name, day) => {
        const spans = value[day] ?? [];
        const error = errors[`accessHours.${day}`] ?? Object.entries(errors).find(([k]) => k.startsWith(`accessHours.${day}.`))?.[1];
        return (
          <div key={name} className="flex flex-wrap items-center gap-2 text-sm" data-day={day}>
            <span className="w-24 font-semibold">{name}</span>
            {spans.length === 0 && <span className="text-slateblue-500">Closed</span>}
            {spans.map(([s, e], i) => (
              <span key={i} className="inline-flex items-center gap-1">
                <input aria-label={`${name} opens`} type="time" className="field w-36 py-1 font-mono" value={hhmm(s)} onChange={(ev) => { const v = parseHhmm(ev.target.value); if (v !== null) setDay(day, spans.map((sp, j) => (j === i ? [v, sp[1]] : sp))); }} />
                –
                <input aria-label={`${name} closes`} type="time" className="field w-36 py-1 font-mono" value={e >= 1440 ? '23:59' : hhmm(e)} onChange={(ev) => { const v = parseHhmm(ev.target.value); if (v !== null) setDay(day, spans.map((sp, j) => (j === i ? [sp[0], v === 1439 ? 1440 : v] : sp))); }} />
                <button type="button" className="text-xs text-ember-800 underline" onClick={() => setDay(day, spans.filter((_, j) => j !== i))}>remove</button>
              </span>
            ))}
            {spans.length < 2 && <button type="button" className="text-xs text-slateblue-700 underline" onClick={() => setDay(day, [...spans, spans.length ? [Math.min(spans[0]![1] + 60, 1380), Math.min(spans[0]![1] + 240, 1440)] : [420, 1140]])}>{spans.length ? 'add a second span' : 'open this day'}</button>}
            {error && <span className="field-error">{error}</span>}
          </div>
        );
      })}
      {errors.accessHours && <p className="field-error">{errors.accessHours}</p>}
    </fieldset>
  );
}
