import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import QueryRoot from '../QueryRoot.tsx';
import FormField from '../FormField.tsx';
import { api } from '../../lib/client/api.ts';
import { farrierCreateSchema } from '../../schemas/farriers.ts';
import { DataTable, TableTools, useServerList, type Column } from './DataTable.tsx';
import RecordActions from './RecordActions.tsx';
import PinPicker, { type Pin } from './PinPicker.tsx';
import { apiErrors, hhmm, money, parseHhmm, WEEKDAYS_SHORT, zodErrors } from './format.ts';

interface Farrier {
  id: number; name: string; phone: string | null; homeAddress: string; homeLat: number; homeLon: number; qualifiedTherapeutic: boolean; apprentice: boolean; hasForge: boolean;
  workingDays: number[]; shiftStartMinute: number; shiftEndMinute: number; breakMinutes: number; breakWindowStartMinute: number; breakWindowEndMinute: number;
  normalWorkMinutes: number; maxOvertimeMinutes: number; costPerHourCents: number; colour: string; archivedAt: string | null; userId: number | null; userEmail: string | null;
}
type User = { id: number; name: string; email: string; farrierId: number | null };

function FarrierForm({ farrier, users, onDone }: { farrier: Farrier | null; users: User[]; onDone: () => void }) {
  const client = useQueryClient();
  const [f, setF] = useState({
    name: farrier?.name ?? '', phone: farrier?.phone ?? '', homeAddress: farrier?.homeAddress ?? '', qualifiedTherapeutic: farrier?.qualifiedTherapeutic ?? false,
    apprentice: farrier?.apprentice ?? false, hasForge: farrier?.hasForge ?? true, start: hhmm(farrier?.shiftStartMinute ?? 450), end: hhmm(farrier?.shiftEndMinute ?? 1020),
    breakMinutes: String(farrier?.breakMinutes ?? 30), breakFrom: hhmm(farrier?.breakWindowStartMinute ?? 690), breakTo: hhmm(farrier?.breakWindowEndMinute ?? 840),
    normalHours: String((farrier?.normalWorkMinutes ?? 480) / 60), maxOvertime: String(farrier?.maxOvertimeMinutes ?? 90), cost: ((farrier?.costPerHourCents ?? 3500) / 100).toFixed(2),
    colour: farrier?.colour ?? '#445a76', userId: farrier?.userId ? String(farrier.userId) : '',
  });
  const [days, setDays] = useState<number[]>(farrier?.workingDays ?? [1, 2, 3, 4, 5]);
  const [home, setHome] = useState<Pin | null>(farrier ? { lat: farrier.homeLat, lon: farrier.homeLon } : null);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const save = useMutation({
    mutationFn: (body: unknown) => (farrier ? api(`/api/farriers/${farrier.id}`, { method: 'PATCH', body }) : api('/api/farriers', { method: 'POST', body })),
    onSuccess: () => { void client.invalidateQueries(); onDone(); },
    onError: (e) => setErrors(apiErrors(e)),
  });
  function submit(e: FormEvent) {
    e.preventDefault();
    const body = {
      name: f.name, phone: f.phone, homeAddress: f.homeAddress, homeLat: home?.lat, homeLon: home?.lon, qualifiedTherapeutic: f.qualifiedTherapeutic, apprentice: f.apprentice,
      hasForge: f.hasForge, workingDays: [...days].sort(), shiftStartMinute: parseHhmm(f.start) ?? undefined, shiftEndMinute: parseHhmm(f.end) ?? undefined,
      breakMinutes: Number(f.breakMinutes), breakWindowStartMinute: parseHhmm(f.breakFrom) ?? undefined, breakWindowEndMinute: parseHhmm(f.breakTo) ?? undefined,
      normalWorkMinutes: Math.round(Number(f.normalHours) * 60), maxOvertimeMinutes: Number(f.maxOvertime), costPerHourCents: Math.round(Number(f.cost) * 100), colour: f.colour,
      userId: f.userId ? Number(f.userId) : null,
    };
    const parsed = farrierCreateSchema.safeParse(body);
    if (!parsed.success) return setErrors(zodErrors(parsed.error));
    setErrors({});
    save.mutate(body);
  }
  const linkable = users.filter((u) => u.farrierId === null || u.farrierId === farrier?.id);
  return (
    <form onSubmit={submit} noValidate className="card space-y-3 p-4" aria-label={farrier ? 'Edit farrier' : 'Add farrier'}>
      <h2>{farrier ? `Edit ${farrier.name}` : 'Add a farrier'}</h2>
      {errors._ && <p role="alert" className="rounded-lg bg-ember-50 px-3 py-2 text-sm text-ember-800">{errors._}</p>}
      <div className="grid gap-3 sm:grid-cols-2">
        <FormField id="f-name" label="Name" error={errors.name}><input id="f-name" className="field" value={f.name} onChange={(e) => setF({ ...f, name: e.target.value })} /></FormField>
        <FormField id="f-phone" label="Phone" error={errors.phone}><input id="f-phone" className="field font-mono" value={f.phone} onChange={(e) => setF({ ...f, phone: e.target.value })} /></FormField>
      </div>
      <FormField id="f-home" label="Home base address" error={errors.homeAddress}><input id="f-home" className="field" value={f.homeAddress} onChange={(e) => setF({ ...f, homeAddress: e.target.value })} /></FormField>
      <PinPicker value={home} onChange={setHome} height="220px" label="Home base" />
      {(errors.homeLat || errors.homeLon) && <p className="field-error">{errors.homeLat ?? errors.homeLon}</p>}
      <fieldset>
        <legend className="label">Working days</legend>
        <div className="flex flex-wrap gap-1">
          {WEEKDAYS_SHORT.map((d, i) => (
            <label key={d} className={`cursor-pointer rounded-full border px-3 py-1 text-sm ${days.includes(i + 1) ? 'border-ember-500 bg-ember-50 text-ember-800' : 'border-slateblue-200'}`}>
              <input type="checkbox" className="sr-only" checked={days.includes(i + 1)} onChange={(e) => setDays(e.target.checked ? [...days, i + 1] : days.filter((x) => x !== i + 1))} />{d}
            </label>
          ))}
        </div>
        {errors.workingDays && <p className="field-error">{errors.workingDays}</p>}
      </fieldset>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
        <FormField id="f-start" label="Day starts" error={errors.shiftStartMinute}><input id="f-start" type="time" className="field font-mono" value={f.start} onChange={(e) => setF({ ...f, start: e.target.value })} /></FormField>
        <FormField id="f-end" label="Day ends" error={errors.shiftEndMinute}><input id="f-end" type="time" className="field font-mono" value={f.end} onChange={(e) => setF({ ...f, end: e.target.value })} /></FormField>
        <FormField id="f-break" label="Break (min)" error={errors.breakMinutes}><input id="f-break" type="number" className="field font-mono" value={f.breakMinutes} onChange={(e) => setF({ ...f, breakMinutes: e.target.value })} /></FormField>
        <FormField id="f-bfrom" label="Break from" error={errors.breakWindowStartMinute}><input id="f-bfrom" type="time" className="field font-mono" value={f.breakFrom} onChange={(e) => setF({ ...f, breakFrom: e.target.value })} /></FormField>
        <FormField id="f-bto" label="Break by" error={errors.breakWindowEndMinute}><input id="f-bto" type="time" className="field font-mono" value={f.breakTo} onChange={(e) => setF({ ...f, breakTo: e.target.value })} /></FormField>
        <FormField id="f-normal" label="Normal hours" error={errors.normalWorkMinutes}><input id="f-normal" type="number" step="0.25" className="field font-mono" value={f.normalHours} onChange={(e) => setF({ ...f, normalHours: e.target.value })} /></FormField>
        <FormField id="f-ot" label="Max overtime (min)" error={errors.maxOvertimeMinutes}><input id="f-ot" type="number" className="field font-mono" value={f.maxOvertime} onChange={(e) => setF({ ...f, maxOvertime: e.target.value })} /></FormField>
        <FormField id="f-cost" label="Cost per hour ($)" error={errors.costPerHourCents}><input id="f-cost" type="number" step="0.01" className="field font-mono" value={f.cost} onChange={(e) => setF({ ...f, cost: e.target.value })} /></FormField>
        <FormField id="f-colour" label="Colour" error={errors.colour}><input id="f-colour" type="color" className="field h-10 p-1" value={f.colour} onChange={(e) => setF({ ...f, colour: e.target.value })} /></FormField>
      </div>
      <div className="flex flex-wrap gap-4 text-sm">
        <label className="flex items-center gap-2"><input type="checkbox" checked={f.hasForge} onChange={(e) => setF({ ...f, hasForge: e.target.checked })} /> Forge on the truck</label>
        <label className="flex items-center gap-2"><input type="checkbox" checked={f.qualifiedTherapeutic} onChange={(e) => setF({ ...f, qualifiedTherapeutic: e.target.checked })} /> Qualified for therapeutic work</label>
        <label className="flex items-center gap-2"><input type="checkbox" checked={f.apprentice} onChange={(e) => setF({ ...f, apprentice: e.target.checked })} /> Apprentice</label>
      </div>
      {errors.qualifiedTherapeutic && <p className="field-error">{errors.qualifiedTherapeutic}</p>}
      <FormField id="f-user" label="Signs in as" error={errors.userId} hint="A user with the farrier role; invite people on the Team page">
        <select id="f-user" className="field" value={f.userId} onChange={(e) => setF({ ...f, userId: e.target.value })}>
          <option value="">No user account</option>
          {linkable.map((u) => <option key={u.id} value={u.id}>{u.name} ({u.email})</option>)}
        </select>
      </FormField>
      <p className="text-xs text-slateblue-500">Long days behind the wheel add up: keep driving hours and fatigue in mind when setting shifts and overtime.</p>
      <div className="flex gap-2">
        <button className="btn-primary" type="submit" disabled={save.isPending}>{save.isPending ? 'Saving…' : farrier ? 'Save farrier' : 'Add farrier'}</button>
        <button className="btn-quiet" type="button" onClick={onDone}>Close</button>
      </div>
      {farrier && <RecordActions endpoint={`/api/farriers/${farrier.id}`} archived={farrier.archivedAt !== null} what="farrier" onDone={onDone} />}
    </form>
  );
}

function Screen({ users }: { users: User[] }) {
  const [archived, setArchived] = useState('exclude');
  const list = useServerList<Farrier>('/api/farriers', { archived }, 'name');
  const [editing, setEditing] = useState<Farrier | 'new' | null>(null);
  const columns: Column<Farrier>[] = [
    { key: 'name', label: 'Farrier', sort: 'name', render: (x) => <span className="inline-flex items-center gap-2 font-semibold"><span className="inline-block h-3 w-3 rounded-full" style={{ background: x.colour }} />{x.name}{x.archivedAt && <span className="rounded bg-slateblue-100 px-1.5 text-[10px] uppercase">archived</span>}</span> },
    { key: 'days', label: 'Days', className: 'whitespace-nowrap', render: (x) => <span className="font-mono text-xs">{x.workingDays.map((d) => WEEKDAYS_SHORT[d - 1]!.slice(0, 2)).join(' ')}</span> },
    { key: 'hours', label: 'Hours', sort: 'shiftStartMinute', className: 'whitespace-nowrap', render: (x) => <span className="figure">{hhmm(x.shiftStartMinute)}–{hhmm(x.shiftEndMinute)}</span> },
    { key: 'skills', label: 'Truck and skills', render: (x) => [x.hasForge ? 'Forge' : 'No forge', x.qualifiedTherapeutic && 'Therapeutic', x.apprentice && 'Apprentice'].filter(Boolean).join(' · ') },
    { key: 'cost', label: 'Cost/h', sort: 'costPerHourCents', className: 'text-right', render: (x) => <span className="figure">{money(x.costPerHourCents)}</span> },
    { key: 'user', label: 'Signs in as', render: (x) => x.userEmail ?? '—' },
  ];
  return (
    <div className="grid gap-4 xl:grid-cols-[1fr_30rem]">
      <div>
        <TableTools q={list.q} setQ={list.setQ} placeholder="Name or home address" archived={archived} setArchived={setArchived}>
          <button type="button" className="btn-primary" onClick={() => setEditing('new')}>Add farrier</button>
        </TableTools>
        <DataTable columns={columns} list={list} rowKey={(x) => x.id} onRowClick={(x) => setEditing(x)} selectedKey={editing && editing !== 'new' ? editing.id : null} empty="No farriers match." />
      </div>
      <div>{editing ? <FarrierForm key={editing === 'new' ? 'new' : editing.id} farrier={editing === 'new' ? null : editing} users={users} onDone={() => setEditing(null)} /> : <p className="text-sm text-slateblue-600">Choose a farrier to edit their home base, days, hours, skills and cost.</p>}</div>
    </div>
  );
}

export default function FarriersScreen(props: { users: User[] }) {
  return <QueryRoot><Screen {...props} /></QueryRoot>;
}
