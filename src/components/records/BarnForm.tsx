import { useMutation } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import QueryRoot from '../QueryRoot.tsx';
import FormField from '../FormField.tsx';
import { api } from '../../lib/client/api.ts';
import { barnCreateSchema, DEFAULT_ACCESS_HOURS, type AccessHours } from '../../schemas/barns.ts';
import PinPicker, { type Pin } from './PinPicker.tsx';
import AddressLookup from './AddressLookup.tsx';
import AccessHoursEditor from './AccessHoursEditor.tsx';
import RecordActions from './RecordActions.tsx';
import { apiErrors, zodErrors } from './format.ts';

export interface BarnInput {
  id: number;
  name: string;
  ownerId: number | null;
  address: string;
  addressPointId: string | null;
  lat: number;
  lon: number;
  accessHours: AccessHours;
  setupMinutes: number;
  notes: string | null;
  archivedAt: string | null;
}

function Form({ barn, owners }: { barn: BarnInput | null; owners: { id: number; name: string }[] }) {
  const [f, setF] = useState({
    name: barn?.name ?? '', ownerId: barn?.ownerId ? String(barn.ownerId) : '', address: barn?.address ?? '', addressPointId: barn?.addressPointId ?? null as string | null,
    setupMinutes: String(barn?.setupMinutes ?? 10), notes: barn?.notes ?? '',
  });
  const [pin, setPin] = useState<Pin | null>(barn ? { lat: barn.lat, lon: barn.lon } : null);
  const [hours, setHours] = useState<AccessHours>(barn?.accessHours ?? DEFAULT_ACCESS_HOURS);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [saved, setSaved] = useState(false);
  const save = useMutation({
    mutationFn: (body: unknown) => (barn ? api<{ barn: { id: number } }>(`/api/barns/${barn.id}`, { method: 'PATCH', body }) : api<{ barn: { id: number } }>('/api/barns', { method: 'POST', body })),
    onSuccess: (data) => {
      if (!barn) window.location.assign(`/barns/${data.barn.id}`);
      else setSaved(true);
    },
    onError: (e) => setErrors(apiErrors(e)),
  });
  function submit(e: FormEvent) {
    e.preventDefault();
    setSaved(false);
    const body = {
      name: f.name, ownerId: f.ownerId ? Number(f.ownerId) : null, address: f.address, addressPointId: f.addressPointId,
      lat: pin?.lat, lon: pin?.lon, accessHours: hours, setupMinutes: f.setupMinutes === '' ? undefined : Number(f.setupMinutes), notes: f.notes,
    };
    const parsed = barnCreateSchema.safeParse(body);
    if (!parsed.success) return setErrors(zodErrors(parsed.error));
    setErrors({});
    save.mutate(body);
  }
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label={barn ? 'Edit barn' : 'Add barn'}>
      {errors._ && <p role="alert" className="rounded-lg bg-ember-50 px-3 py-2 text-sm text-ember-800">{errors._}</p>}
      {saved && <p role="status" className="rounded-lg bg-slateblue-50 px-3 py-2 text-sm">Barn saved.</p>}
      <div className="grid gap-4 lg:grid-cols-2">
        <section className="card space-y-3 p-4">
          <FormField id="barn-name" label="Name" error={errors.name}><input id="barn-name" className="field" value={f.name} onChange={(e) => setF({ ...f, name: e.target.value })} /></FormField>
          <FormField id="barn-owner" label="Owner (none for a boarding barn)" error={errors.ownerId}>
            <select id="barn-owner" className="field" value={f.ownerId} onChange={(e) => setF({ ...f, ownerId: e.target.value })}>
              <option value="">No single owner</option>
              {owners.map((o) => <option key={o.id} value={o.id}>{o.name}</option>)}
            </select>
          </FormField>
          <FormField id="barn-address" label="Address" error={errors.address} hint={f.addressPointId ? 'Matched to an address point of the region' : 'Pick a suggestion to move the pin, or place the pin by hand'}>
            <AddressLookup id="barn-address" value={f.address} invalid={Boolean(errors.address)} onText={(v) => setF({ ...f, address: v, addressPointId: null })} onPick={(a) => { setF({ ...f, address: a.text, addressPointId: a.id }); setPin({ lat: a.lat, lon: a.lon }); }} />
          </FormField>
          <FormField id="barn-setup" label="Set-up minutes per stop" error={errors.setupMinutes}><input id="barn-setup" type="number" min={0} className="field w-32 font-mono" value={f.setupMinutes} onChange={(e) => setF({ ...f, setupMinutes: e.target.value })} /></FormField>
          <FormField id="barn-notes" label="Notes (gate codes, parking, dogs)" error={errors.notes}><textarea id="barn-notes" rows={3} className="field" value={f.notes} onChange={(e) => setF({ ...f, notes: e.target.value })} /></FormField>
        </section>
        <section className="card space-y-2 p-4">
          <p className="label">Pin</p>
          <PinPicker value={pin} onChange={setPin} label="Barn pin" />
          {(errors.lat || errors.lon) && <p className="field-error">{errors.lat ?? errors.lon}</p>}
        </section>
      </div>
      <section className="card p-4"><AccessHoursEditor value={hours} onChange={setHours} errors={errors} /></section>
      <div className="flex flex-wrap items-start justify-between gap-4">
        <button className="btn-primary" type="submit" disabled={save.isPending}>{save.isPending ? 'Saving…' : barn ? 'Save barn' : 'Add barn'}</button>
        {barn && <RecordActions endpoint={`/api/barns/${barn.id}`} archived={barn.archivedAt !== null} what="barn" onDone={(deleted) => window.location.assign(deleted ? '/barns' : `/barns/${barn.id}`)} />}
      </div>
    </form>
  );
}

export default function BarnForm(props: { barn: BarnInput | null; owners: { id: number; name: string }[] }) {
  return <QueryRoot><Form {...props} /></QueryRoot>;
}
