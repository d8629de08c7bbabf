/**
 * The practice's text settings (client:load): arrival and update templates with a live preview and
 * segment count as you type (the same rendering and counting code the server sends with), the window
 * widths, the update threshold and quiet hours. Leads save; dispatchers see the settings read-only.
 */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import QueryRoot from '../QueryRoot';
import { api, ApiError } from '../../lib/client/api';
import { previewTemplate, PLACEHOLDERS, unknownPlaceholders } from '../../lib/messaging/template';
import type { TextSettings } from '../../lib/messaging/text-settings';

interface Props {
  initial: TextSettings;
  practiceName: string;
  canEdit: boolean;
}

const hhmm = (minute: number) => `${String(Math.floor(minute / 60)).padStart(2, '0')}:${String(minute % 60).padStart(2, '0')}`;
const toMinute = (value: string) => {
  const [h, m] = value.split(':').map(Number);
  return (h ?? 0) * 60 + (m ?? 0);
};

function Preview({ template, practiceName, label }: { template: string; practiceName: string; label: string }) {
  const p = useMemo(() => previewTemplate(template, practiceName), [template, practiceName]);
  const unknown = unknownPlaceholders(template);
  return (
    <div className="mt-2 rounded-lg bg-slateblue-50 p-3" aria-live="polite" data-testid={`preview-${label}`}>
      <p className="whitespace-pre-wrap text-sm">{p.body}</p>
      <p className="mt-2 text-xs text-slateblue-700">
        <span className="figure font-semibold" data-testid={`segments-${label}`}>{p.segments}</span> segment{p.segments === 1 ? '' : 's'} ·{' '}
        <span className="figure">{p.units}</span> {p.encoding === 'gsm7' ? 'GSM-7 characters' : 'UCS-2 units'} ·{' '}
        <span className="figure">{p.encoding === 'gsm7' ? 'GSM-7' : 'UCS-2'}</span>
        {p.segments > 1 && <> · <span className="figure">{p.perSegment}</span> per segment</>}
      </p>
      {p.nonGsm.length > 0 && (
        <p className="mt-1 text-xs text-ember-800">These characters make the whole text UCS-2 (fewer characters per segment): {p.nonGsm.map((c) => `“${c}”`).join(' ')}</p>
      )}
      {unknown.length > 0 && <p className="mt-1 text-xs text-ember-800">Not a placeholder: {unknown.map((u) => `{${u}}`).join(', ')}</p>}
    </div>
  );
}

function Editor({ initial, practiceName, canEdit }: Props) {
  const [form, setForm] = useState<TextSettings>(initial);
  const [fields, setFields] = useState<Record<string, string>>({});
  const [saved, setSaved] = useState(false);
  const client = useQueryClient();
  const save = useMutation({
    mutationFn: (body: TextSettings) => api<{ settings: TextSettings }>('/api/templates', { method: 'PUT', body }),
    onSuccess: (answer) => {
      setForm(answer.settings);
      setFields({});
      setSaved(true);
      void client.invalidateQueries();
    },
    onError: (e) => {
      setSaved(false);
      if (e instanceof ApiError) setFields({ ...e.fields, _: e.message });
    },
  });
  const set = <K extends keyof TextSettings>(key: K, value: TextSettings[K]) => {
    setSaved(false);
    setForm((f) => ({ ...f, [key]: value }));
  };
  const number = (key: keyof TextSettings, label: string, hint: string) => (
    <label className="block">
      <span className="label">{label}</span>
      <input type="number" className="field figure" value={form[key] as number} disabled={!canEdit} onChange={(e) => set(key, Number(e.target.value) as never)} />
      <span className="mt-1 block text-xs text-slateblue-500">{hint}</span>
      {fields[key] && <span className="field-error">{fields[key]}</span>}
    </label>
  );
  return (
    <form
      className="card space-y-5 p-5"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate(form);
      }}
    >
      <div>
        <h2>Texts to owners</h2>
        <p className="text-sm text-slateblue-600">
          Placeholders: {PLACEHOLDERS.map((p) => <code key={p} className="mr-1 rounded bg-slateblue-50 px-1 font-mono text-xs">{`{${p}}`}</code>)}. Keep to plain letters, digits and common signs: one curly quote or emoji makes every segment hold 70 characters instead of 160.
        </p>
      </div>
      {(['arrivalTemplate', 'updateTemplate'] as const).map((key) => (
        <label key={key} className="block">
          <span className="label">{key === 'arrivalTemplate' ? 'Arrival window text (on publish)' : 'Update text (window moved)'}</span>
          <textarea className="field min-h-24 font-mono text-sm" value={form[key]} disabled={!canEdit} onChange={(e) => set(key, e.target.value)} data-testid={key} />
          {fields[key] && <span className="field-error">{fields[key]}</span>}
          <Preview template={form[key]} practiceName={practiceName} label={key === 'arrivalTemplate' ? 'arrival' : 'update'} />
        </label>
      ))}
      <div className="grid gap-4 sm:grid-cols-2">
        {number('windowMinMinutes', 'Window at the first stop, minutes', 'Centred on the planned arrival, rounded to 15 minutes.')}
        {number('windowGrowthMinutes', 'Wider per later stop, minutes', 'Each stop along the route can run long.')}
        {number('windowMaxMinutes', 'Widest window, minutes', 'A cap for long days.')}
        {number('updateThresholdMinutes', 'Update when a window moves more than, minutes', 'Smaller changes send nothing.')}
        <label className="block">
          <span className="label">Quiet from</span>
          <input type="time" className="field figure" value={hhmm(form.quietStartMinute)} disabled={!canEdit} onChange={(e) => set('quietStartMinute', toMinute(e.target.value))} />
        </label>
        <label className="block">
          <span className="label">Quiet until</span>
          <input type="time" className="field figure" value={hhmm(form.quietEndMinute)} disabled={!canEdit} onChange={(e) => set('quietEndMinute', toMinute(e.target.value))} />
          <span className="mt-1 block text-xs text-slateblue-500">In the practice's time zone. Texts due in quiet hours wait until it ends.</span>
        </label>
      </div>
      {fields._ && <p role="alert" className="field-error">{fields._}</p>}
      {canEdit ? (
        <div className="flex items-center gap-3">
          <button type="submit" className="btn-primary" disabled={save.isPending}>{save.isPending ? 'Saving…' : 'Save text settings'}</button>
          {saved && <span className="text-sm text-slateblue-600">Saved.</span>}
        </div>
      ) : (
        <p className="text-sm text-slateblue-500">The practice lead changes these settings.</p>
      )}
    </form>
  );
}

export default function TemplateEditor(props: Props) {
  return (
    <QueryRoot>
      <Editor {...props} />
    </QueryRoot>
  );
}
