import { useMutation } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import QueryRoot from '../QueryRoot.tsx';
import FormField from '../FormField.tsx';
import { api } from '../../lib/client/api.ts';
import { horseCreateSchema } from '../../schemas/horses.ts';
import RecordActions from './RecordActions.tsx';
import { apiErrors, zodErrors } from './format.ts';

export interface HorseInput {
  id: number; name: string; ownerId: number; barnId: number; cycleWeeks: number; lastVisitOn: string | null;
  shoeSize: string | null; notes: string | null; needsSecondPerson: boolean; archivedAt: string | null; workTypes: { id: number }[];
}
type Option = { id: number; name: string };

function Form({ horse, owners, barns, workTypes, barnId }: { horse: HorseInput | null; owners: Option[]; barns: Option[]; workTypes: (Option & { minutesPerHorse: number })[]; barnId?: number }) {
  const [f, setF] = useState({
    name: horse?.name ?? '', ownerId: horse ? String(horse.ownerId) : '', barnId: horse ? String(horse.barnId) : barnId ? String(barnId) : '',
    cycleWeeks: String(horse?.cycleWeeks ?? 6), lastVisitOn: horse?.lastVisitOn ?? '', shoeSize: horse?.shoeSize ?? '', notes: horse?.notes ?? '',
    needsSecondPerson: horse?.needsSecondPerson ?? false,
  });
  const [work, setWork] = useState<number[]>(horse?.workTypes.map((w) => w.id) ?? []);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [saved, setSaved] = useState(false);
  const save = useMutation({
    mutationFn: (body: unknown) => (horse ? api<{ horse: { id: number } }>(`/api/horses/${horse.id}`, { method: 'PATCH', body }) : api<{ horse: { id: number } }>('/api/horses', { method: 'POST', body })),
    onSuccess: (data) => { if (!horse) window.location.assign(`/horses/${data.horse.id}`); else setSaved(true); },
    onError: (e) => setErrors(apiErrors(e)),
  });
  const minutes = workTypes.filter((w) => work.includes(w.id)).reduce((s, w) => s + w.minutesPerHorse, 0);
  function submit(e: FormEvent) {
    e.preventDefault();
    setSaved(false);
    const body = {
      name: f.name, ownerId: f.ownerId ? Number(f.ownerId) : undefined, barnId: f.barnId ? Number(f.barnId) : undefined,
      cycleWeeks: f.cycleWeeks === '' ? undefined : Number(f.cycleWeeks), lastVisitOn: f.lastVisitOn, shoeSize: f.shoeSize, notes: f.notes,
      needsSecondPerson: f.needsSecondPerson, workTypeIds: work,
    };
    const parsed = horseCreateSchema.safeParse(body);
    if (!parsed.success) return setErrors(zodErrors(parsed.error));
    setErrors({});
    save.mutate(body);
  }
  return (
    <form onSubmit={submit} noValidate className="card space-y-3 p-4" aria-label={horse ? 'Edit horse' : 'Add horse'}>
      {errors._ && <p role="alert" className="rounded-lg bg-ember-50 px-3 py-2 text-sm text-ember-800">{errors._}</p>}
      {saved && <p role="status" className="rounded-lg bg-slateblue-50 px-3 py-2 text-sm">Horse saved.</p>}
      <div className="grid gap-3 sm:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <FormField id="horse-name" label="Name" error={errors.name}><input id="horse-name" className="field" value={f.name} onChange={(e) => setF({ ...f, name: e.target.value })} /></FormField>
        <FormField id="horse-owner" label="Owner" error={errors.ownerId}>
          <select id="horse-owner" className="field" value={f.ownerId} onChange={(e) => setF({ ...f, ownerId: e.target.value })}>
            <option value="">Choose an owner</option>
            {owners.map((o) => <option key={o.id} value={o.id}>{o.name}</option>)}
          </select>
        </FormField>
        <FormField id="horse-barn" label="Barn" error={errors.barnId}>
          <select id="horse-barn" className="field" value={f.barnId} onChange={(e) => setF({ ...f, barnId: e.target.value })}>
            <option value="">Choose a barn</option>
            {barns.map((b) => <option key={b.id} value={b.id}>{b.name}</option>)}
          </select>
        </FormField>
        <FormField id="horse-last" label="Last visit" error={errors.lastVisitOn}><input id="horse-last" type="date" className="field font-mono" value={f.lastVisitOn} onChange={(e) => setF({ ...f, lastVisitOn: e.target.value })} /></FormField>
        <FormField id="horse-cycle" label="Cycle (weeks)" error={errors.cycleWeeks}><input id="horse-cycle" type="number" min={1} max={26} className="field font-mono" value={f.cycleWeeks} onChange={(e) => setF({ ...f, cycleWeeks: e.target.value })} /></FormField>
        <FormField id="horse-shoe" label="Shoe size" error={errors.shoeSize}><input id="horse-shoe" className="field font-mono" value={f.shoeSize} onChange={(e) => setF({ ...f, shoeSize: e.target.value })} /></FormField>
      </div>
      <fieldset>
        <legend className="label">Usual work <span className="font-mono normal-case">({minutes} min)</span></legend>
        <div className="flex flex-wrap gap-2">
          {workTypes.map((w) => (
            <label key={w.id} className={`cursor-pointer rounded-full border px-3 py-1 text-sm ${work.includes(w.id) ? 'border-ember-500 bg-ember-50 text-ember-800' : 'border-slateblue-200 bg-white'}`}>
              <input type="checkbox" className="sr-only" checked={work.includes(w.id)} onChange={(e) => setWork(e.target.checked ? [...work, w.id] : work.filter((x) => x !== w.id))} />
              {w.name}
            </label>
          ))}
        </div>
        {errors.workTypeIds && <p className="field-error">{errors.workTypeIds}</p>}
      </fieldset>
      <FormField id="horse-notes" label="Notes (pads, behaviour, vet's advice)" error={errors.notes}><textarea id="horse-notes" rows={3} className="field" value={f.notes} onChange={(e) => setF({ ...f, notes: e.target.value })} /></FormField>
      <label className="flex items-center gap-2 text-sm"><input type="checkbox" checked={f.needsSecondPerson} onChange={(e) => setF({ ...f, needsSecondPerson: e.target.checked })} /> Needs a second person to hold</label>
      {f.needsSecondPerson && <p className="caution">Kick risk: plan a holder for this horse. Sedation is given only by a veterinarian.</p>}
      <div className="flex flex-wrap items-start justify-between gap-4">
        <button className="btn-primary" type="submit" disabled={save.isPending}>{save.isPending ? 'Saving…' : horse ? 'Save horse' : 'Add horse'}</button>
        {horse && <RecordActions endpoint={`/api/horses/${horse.id}`} archived={horse.archivedAt !== null} what="horse" onDone={(deleted) => window.location.assign(deleted ? '/horses' : `/horses/${horse.id}`)} />}
      </div>
    </form>
  );
}

export default function HorseForm(props: { horse: HorseInput | null; owners: Option[]; barns: Option[]; workTypes: (Option & { minutesPerHorse: number })[]; barnId?: number }) {
  return <QueryRoot><Form {...props} /></QueryRoot>;
}
