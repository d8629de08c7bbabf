import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import QueryRoot from './QueryRoot.tsx';
import FormField from './FormField.tsx';
import { api } from '../lib/client/api.ts';
import { apiErrors, zodErrors } from '../lib/client/form-errors.ts';
import { settingsSchema, type SettingsInput } from '../schemas/settings.ts';

type Settings = Required<{ [K in keyof SettingsInput]: Exclude<SettingsInput[K], undefined> }>;

const WEEKDAYS = ['Sunday', 'Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday'];

function hours(minutes: number | null): string {
  return minutes == null ? '' : String(minutes / 60);
}

function Form({ initial }: { initial: Settings }) {
  const client = useQueryClient();
  const [s, setS] = useState(initial);
  const [daily, setDaily] = useState(initial.overtimeDailyMinutes != null);
  const [fields, setFields] = useState<Record<string, string>>({});
  const [saved, setSaved] = useState(false);
  const save = useMutation({
    mutationFn: (body: unknown) => api<{ settings: Settings }>('/api/settings', { method: 'PATCH', body }),
    onSuccess: (data) => {
      setS(data.settings);
      setSaved(true);
      void client.invalidateQueries();
    },
    onError: (e) => setFields(apiErrors(e)),
  });

  const num = (v: string) => (v.trim() === '' ? null : Number(v));
  function submit(event: FormEvent) {
    event.preventDefault();
    setSaved(false);
    const body = {
      ...s,
      overtimeDailyMinutes: daily ? s.overtimeDailyMinutes : null,
      overtimeDailyMultiplier: daily ? s.overtimeDailyMultiplier : null,
      overtimeDailyDoubleMinutes: daily ? s.overtimeDailyDoubleMinutes : null,
      overtimeDailyDoubleMultiplier: daily ? s.overtimeDailyDoubleMultiplier : null,
    };
    const parsed = settingsSchema.safeParse(body);
    if (!parsed.success) {
      setFields(zodErrors(parsed.error));
      return;
    }
    setFields({});
    save.mutate(body);
  }

  return (
    <form onSubmit={submit} className="space-y-6" noValidate>
      {fields._ && <p role="alert" className="rounded-lg bg-ember-50 px-3 py-2 text-sm text-ember-800">{fields._}</p>}
      {saved && <p role="status" className="rounded-lg bg-slateblue-50 px-3 py-2 text-sm">Settings saved.</p>}
      <section className="card grid gap-4 p-4 sm:grid-cols-2">
        <h2 className="sm:col-span-2">Practice</h2>
        <FormField id="name" label="Name" error={fields.name}>
          <input id="name" className="field" value={s.name} onChange={(e) => setS({ ...s, name: e.target.value })} />
        </FormField>
        <FormField id="timeZone" label="Time zone" error={fields.timeZone} hint="IANA name, e.g. America/New_York">
          <input id="timeZone" className="field font-mono" value={s.timeZone} onChange={(e) => setS({ ...s, timeZone: e.target.value })} />
        </FormField>
        <FormField id="weekStart" label="Week starts on" error={fields.weekStart}>
          <select id="weekStart" className="field" value={s.weekStart} onChange={(e) => setS({ ...s, weekStart: Number(e.target.value) })}>
            {WEEKDAYS.map((d, i) => <option key={d} value={i}>{d}</option>)}
          </select>
        </FormField>
        <FormField id="planningHorizonDays" label="Plan jobs due within (days)" error={fields.planningHorizonDays}>
          <input id="planningHorizonDays" type="number" className="field font-mono" value={s.planningHorizonDays} onChange={(e) => setS({ ...s, planningHorizonDays: Number(e.target.value) })} />
        </FormField>
        <FormField id="contactPhone" label="Contact phone (E.164)" error={fields.contactPhone}>
          <input id="contactPhone" className="field font-mono" value={s.contactPhone ?? ''} onChange={(e) => setS({ ...s, contactPhone: e.target.value || null })} />
        </FormField>
        <FormField id="contactEmail" label="Contact e-mail" error={fields.contactEmail}>
          <input id="contactEmail" className="field" value={s.contactEmail ?? ''} onChange={(e) => setS({ ...s, contactEmail: e.target.value || null })} />
        </FormField>
      </section>
      <section className="card grid gap-4 p-4 sm:grid-cols-2">
        <h2 className="sm:col-span-2">Distance and mileage</h2>
        <FormField id="units" label="Units" error={fields.units}>
          <select id="units" className="field" value={s.units} onChange={(e) => setS({ ...s, units: e.target.value as Settings['units'] })}>
            <option value="miles">Miles</option>
            <option value="km">Kilometres</option>
          </select>
        </FormField>
        <FormField id="mileageRate" label={`Mileage rate per ${s.units === 'miles' ? 'mile' : 'km'}`} error={fields.mileageRate} hint="e.g. 0.70 for 70 cents">
          <input id="mileageRate" type="number" step="0.001" className="field font-mono" value={s.mileageRate} onChange={(e) => setS({ ...s, mileageRate: Number(e.target.value) })} />
        </FormField>
      </section>
      <section className="card grid gap-4 p-4 sm:grid-cols-2">
        <h2 className="sm:col-span-2">Overtime rule</h2>
        <FormField id="overtimeWeeklyMinutes" label="Weekly threshold (hours)" error={fields.overtimeWeeklyMinutes}>
          <input id="overtimeWeeklyMinutes" type="number" step="0.25" className="field font-mono" value={hours(s.overtimeWeeklyMinutes)} onChange={(e) => setS({ ...s, overtimeWeeklyMinutes: Math.round(Number(e.target.value) * 60) })} />
        </FormField>
        <FormField id="overtimeWeeklyMultiplier" label="Weekly multiplier" error={fields.overtimeWeeklyMultiplier}>
          <input id="overtimeWeeklyMultiplier" type="number" step="0.05" className="field font-mono" value={s.overtimeWeeklyMultiplier} onChange={(e) => setS({ ...s, overtimeWeeklyMultiplier: Number(e.target.value) })} />
        </FormField>
        <label className="flex items-center gap-2 text-sm sm:col-span-2">
          <input type="checkbox" checked={daily} onChange={(e) => {
            setDaily(e.target.checked);
            if (e.target.checked && s.overtimeDailyMinutes == null) setS({ ...s, overtimeDailyMinutes: 480, overtimeDailyMultiplier: 1.5, overtimeDailyDoubleMinutes: 720, overtimeDailyDoubleMultiplier: 2 });
          }} />
          Also count overtime per day
        </label>
        {daily && (<>
          <FormField id="overtimeDailyMinutes" label="Daily threshold (hours)" error={fields.overtimeDailyMinutes}>
            <input id="overtimeDailyMinutes" type="number" step="0.25" className="field font-mono" value={hours(s.overtimeDailyMinutes)} onChange={(e) => { const h = num(e.target.value); setS({ ...s, overtimeDailyMinutes: h == null ? null : Math.round(h * 60) }); }} />
          </FormField>
          <FormField id="overtimeDailyMultiplier" label="Daily multiplier" error={fields.overtimeDailyMultiplier}>
            <input id="overtimeDailyMultiplier" type="number" step="0.05" className="field font-mono" value={s.overtimeDailyMultiplier ?? ''} onChange={(e) => setS({ ...s, overtimeDailyMultiplier: num(e.target.value) })} />
          </FormField>
          <FormField id="overtimeDailyDoubleMinutes" label="Double-time threshold (hours)" error={fields.overtimeDailyDoubleMinutes}>
            <input id="overtimeDailyDoubleMinutes" type="number" step="0.25" className="field font-mono" value={hours(s.overtimeDailyDoubleMinutes)} onChange={(e) => { const h = num(e.target.value); setS({ ...s, overtimeDailyDoubleMinutes: h == null ? null : Math.round(h * 60) }); }} />
          </FormField>
          <FormField id="overtimeDailyDoubleMultiplier" label="Double-time multiplier" error={fields.overtimeDailyDoubleMultiplier}>
            <input id="overtimeDailyDoubleMultiplier" type="number" step="0.05" className="field font-mono" value={s.overtimeDailyDoubleMultiplier ?? ''} onChange={(e) => setS({ ...s, overtimeDailyDoubleMultiplier: num(e.target.value) })} />
          </FormField>
        </>)}
        <p className="text-xs text-slateblue-500 sm:col-span-2">Overtime rules differ by country and state; check the labour law that applies to your practice.</p>
      </section>
      <button className="btn-primary" type="submit" disabled={save.isPending}>{save.isPending ? 'Saving…' : 'Save settings'}</button>
    </form>
  );
}

export default function SettingsForm({ initial }: { initial: Settings }) {
  return <QueryRoot><Form initial={initial} /></QueryRoot>;
}
