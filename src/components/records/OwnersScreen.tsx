import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import QueryRoot from '../QueryRoot.tsx';
import FormField from '../FormField.tsx';
import { api } from '../../lib/client/api.ts';
import { ownerCreateSchema } from '../../schemas/owners.ts';
import { DataTable, TableTools, useServerList, type Column } from './DataTable.tsx';
import RecordActions from './RecordActions.tsx';
import { apiErrors, zodErrors } from './format.ts';

interface Owner { id: number; name: string; phone: string | null; email: string | null; textConsentAt: string | null; optedOutAt: string | null; notes: string | null; archivedAt: string | null; horses: number; barns: number }

function OwnerForm({ owner, onSaved, onCancel }: { owner: Owner | null; onSaved: () => void; onCancel: () => void }) {
  const client = useQueryClient();
  const [f, setF] = useState({ name: owner?.name ?? '', phone: owner?.phone ?? '', email: owner?.email ?? '', textConsent: Boolean(owner?.textConsentAt), notes: owner?.notes ?? '' });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const save = useMutation({
    mutationFn: (body: unknown) => (owner ? api(`/api/owners/${owner.id}`, { method: 'PATCH', body }) : api('/api/owners', { method: 'POST', body })),
    onSuccess: () => { void client.invalidateQueries(); onSaved(); },
    onError: (e) => setErrors(apiErrors(e)),
  });
  function submit(e: FormEvent) {
    e.preventDefault();
    const parsed = ownerCreateSchema.safeParse(f);
    if (!parsed.success) return setErrors(zodErrors(parsed.error));
    setErrors({});
    save.mutate(f);
  }
  return (
    <form onSubmit={submit} noValidate className="card space-y-3 p-4" aria-label={owner ? 'Edit owner' : 'Add owner'}>
      <h2>{owner ? `Edit ${owner.name}` : 'Add an owner'}</h2>
      {errors._ && <p role="alert" className="rounded-lg bg-ember-50 px-3 py-2 text-sm text-ember-800">{errors._}</p>}
      <FormField id="owner-name" label="Name" error={errors.name}><input id="owner-name" className="field" value={f.name} onChange={(e) => setF({ ...f, name: e.target.value })} /></FormField>
      <FormField id="owner-phone" label="Mobile phone" error={errors.phone} hint="Stored as E.164, e.g. +18595550142"><input id="owner-phone" className="field font-mono" inputMode="tel" value={f.phone} onChange={(e) => setF({ ...f, phone: e.target.value })} /></FormField>
      <FormField id="owner-email" label="E-mail" error={errors.email}><input id="owner-email" className="field" type="email" value={f.email} onChange={(e) => setF({ ...f, email: e.target.value })} /></FormField>
      <label className="flex items-center gap-2 text-sm"><input type="checkbox" checked={f.textConsent} onChange={(e) => setF({ ...f, textConsent: e.target.checked })} /> Agreed to receive texts about visits</label>
      {owner?.optedOutAt && <p className="caution">Replied STOP on {owner.optedOutAt.slice(0, 10)}: no texts are sent until they opt back in.</p>}
      <FormField id="owner-notes" label="Notes" error={errors.notes}><textarea id="owner-notes" className="field" rows={3} value={f.notes} onChange={(e) => setF({ ...f, notes: e.target.value })} /></FormField>
      <div className="flex gap-2">
        <button className="btn-primary" type="submit" disabled={save.isPending}>{save.isPending ? 'Saving…' : owner ? 'Save owner' : 'Add owner'}</button>
        <button className="btn-quiet" type="button" onClick={onCancel}>Close</button>
      </div>
      {owner && <RecordActions endpoint={`/api/owners/${owner.id}`} archived={owner.archivedAt !== null} what="owner" onDone={onSaved} />}
    </form>
  );
}

function Screen() {
  const [archived, setArchived] = useState('exclude');
  const list = useServerList<Owner>('/api/owners', { archived }, 'name');
  const [editing, setEditing] = useState<Owner | 'new' | null>(null);
  const columns: Column<Owner>[] = [
    { key: 'name', label: 'Name', sort: 'name', render: (o) => <span className="font-semibold">{o.name}{o.archivedAt && <span className="ml-2 rounded bg-slateblue-100 px-1.5 text-[10px] uppercase">archived</span>}</span> },
    { key: 'phone', label: 'Phone', sort: 'phone', render: (o) => <span className="figure">{o.phone ?? '—'}</span> },
    { key: 'email', label: 'E-mail', render: (o) => o.email ?? '—' },
    { key: 'texts', label: 'Texts', render: (o) => (o.optedOutAt ? <span className="text-ember-800">Opted out</span> : o.textConsentAt ? 'Yes' : 'No consent') },
    { key: 'horses', label: 'Horses', sort: 'horses', className: 'text-right', render: (o) => <span className="figure">{o.horses}</span> },
  ];
  return (
    <div className="grid gap-4 lg:grid-cols-[1fr_22rem]">
      <div>
        <TableTools q={list.q} setQ={list.setQ} placeholder="Name, phone or e-mail" archived={archived} setArchived={setArchived}>
          <button type="button" className="btn-primary" onClick={() => setEditing('new')}>Add owner</button>
        </TableTools>
        <DataTable columns={columns} list={list} rowKey={(o) => o.id} onRowClick={(o) => setEditing(o)} selectedKey={editing && editing !== 'new' ? editing.id : null} empty="No owners match." />
      </div>
      <div>
        {editing ? (
          <OwnerForm key={editing === 'new' ? 'new' : editing.id} owner={editing === 'new' ? null : editing} onSaved={() => setEditing(null)} onCancel={() => setEditing(null)} />
        ) : (
          <p className="text-sm text-slateblue-600">Choose an owner to edit, or add one. Owners with horses or messages cannot be deleted; archive them to keep their history.</p>
        )}
      </div>
    </div>
  );
}

export default function OwnersScreen() {
  return <QueryRoot><Screen /></QueryRoot>;
}
