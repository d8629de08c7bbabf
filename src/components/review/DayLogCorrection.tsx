/**
 * The office's correction of one farrier's logged day on the review's day page: start and end times
 * (on the practice's clock), odometer readings, and the reason, which the audit log keeps with the
 * figures before and after. Only what was changed is sent; the server works the distance out again.
 */
import { useMutation } from '@tanstack/react-query';
import { useId, useState, type FormEvent } from 'react';
import { localClock } from '../../lib/review/time.ts';
import { atLocal } from '../../lib/messaging/local-time.ts';
import QueryRoot from '../QueryRoot.tsx';
import FormField from '../FormField.tsx';
import { api } from '../../lib/client/api.ts';
import { apiErrors, zodErrors } from '../../lib/client/form-errors.ts';
import { dayLogCorrectionSchema } from '../../schemas/day-logs.ts';

export interface DayLogCorrectionProps {
  dayLogId: number;
  /** The work day, YYYY-MM-DD, in the practice's time zone. */
  date: string;
  timeZone: string;
  startedAt: string;
  endedAt: string | null;
  startOdometer: number | null;
  endOdometer: number | null;
  /** "mi" or "km". */
  unit: string;
  farrierName: string;
}

const clock = (iso: string | null, tz: string) => (iso ? localClock(new Date(iso), tz) : '');
const reading = (n: number | null) => (n == null ? '' : String(n));

function Form(p: DayLogCorrectionProps) {
  const id = useId();
  const [open, setOpen] = useState(false);
  const [start, setStart] = useState(clock(p.startedAt, p.timeZone));
  const [end, setEnd] = useState(clock(p.endedAt, p.timeZone));
  const [startOdo, setStartOdo] = useState(reading(p.startOdometer));
  const [endOdo, setEndOdo] = useState(reading(p.endOdometer));
  const [reason, setReason] = useState('');
  const [fields, setFields] = useState<Record<string, string>>({});
  const save = useMutation({
    mutationFn: (body: unknown) => api(`/api/day-logs/${p.dayLogId}`, { method: 'PATCH', body }),
    // the page's figures are worked out on the server: show them as they now stand
    onSuccess: () => window.location.reload(),
    onError: (e) => setFields(apiErrors(e)),
  });

  function submit(event: FormEvent) {
    event.preventDefault();
    if (start === '') {
      setFields({ startedAt: 'Give the time the farrier left home' });
      return;
    }
    const body: Record<string, unknown> = { reason };
    const at = (hhmm: string) => {
      const [h, m] = hhmm.split(':').map(Number);
      return atLocal(p.date, h! * 60 + m!, p.timeZone).toISOString();
    };
    const odo = (v: string) => (v.trim() === '' ? null : Number(v));
    if (start !== clock(p.startedAt, p.timeZone)) body.startedAt = at(start);
    if (end !== clock(p.endedAt, p.timeZone)) body.endedAt = end === '' ? null : at(end);
    if (startOdo !== reading(p.startOdometer)) body.startOdometer = odo(startOdo);
    if (endOdo !== reading(p.endOdometer)) body.endOdometer = odo(endOdo);
    const parsed = dayLogCorrectionSchema.safeParse(body);
    if (!parsed.success) {
      const errors = zodErrors(parsed.error);
      if (errors._) errors._ = 'Change a time or a reading first.';
      setFields(errors);
      return;
    }
    setFields({});
    save.mutate(parsed.data);
  }

  if (!open) {
    return (
      <button type="button" className="btn-quiet text-sm" onClick={() => setOpen(true)} data-testid="correct-day">
        Correct this day
      </button>
    );
  }
  return (
    <form onSubmit={submit} noValidate className="space-y-3 rounded-lg border border-slateblue-200 bg-slateblue-50 p-4" aria-label={`Correct the day of ${p.farrierName}`}>
      <p className="text-sm text-slateblue-700">
        Correct {p.farrierName}’s logged day. Times are on the practice’s clock ({p.timeZone}); readings in whole {p.unit}. The reason is
        kept with the figures before and after.
      </p>
      {fields._ && <p role="alert" className="rounded-lg bg-ember-50 px-3 py-2 text-sm text-ember-800">{fields._}</p>}
      <div className="grid gap-3 sm:grid-cols-4">
        <FormField id={`${id}-start`} label="Left home" error={fields.startedAt}>
          <input id={`${id}-start`} name="startedAt" type="time" className="field figure" value={start} onChange={(e) => setStart(e.target.value)} />
        </FormField>
        <FormField id={`${id}-end`} label="Back home" error={fields.endedAt} hint="Empty reopens the day">
          <input id={`${id}-end`} name="endedAt" type="time" className="field figure" value={end} onChange={(e) => setEnd(e.target.value)} />
        </FormField>
        <FormField id={`${id}-startodo`} label={`Odometer at the start (${p.unit})`} error={fields.startOdometer}>
          <input id={`${id}-startodo`} name="startOdometer" inputMode="numeric" className="field figure" value={startOdo} onChange={(e) => setStartOdo(e.target.value)} />
        </FormField>
        <FormField id={`${id}-endodo`} label={`Odometer back home (${p.unit})`} error={fields.endOdometer}>
          <input id={`${id}-endodo`} name="endOdometer" inputMode="numeric" className="field figure" value={endOdo} onChange={(e) => setEndOdo(e.target.value)} />
        </FormField>
      </div>
      <FormField id={`${id}-reason`} label="Reason" error={fields.reason}>
        <input id={`${id}-reason`} name="reason" className="field" value={reason} maxLength={255} onChange={(e) => setReason(e.target.value)} placeholder="For example: odometer misread at home" />
      </FormField>
      <div className="flex gap-2">
        <button type="submit" className="btn-primary" disabled={save.isPending}>{save.isPending ? 'Saving…' : 'Save the correction'}</button>
        <button type="button" className="btn-quiet" onClick={() => { setOpen(false); setFields({}); }}>Cancel</button>
      </div>
    </form>
  );
}

export default function DayLogCorrection(props: DayLogCorrectionProps) {
  return (
    <QueryRoot>
      <Form {...props} />
    </QueryRoot>
  );
}
