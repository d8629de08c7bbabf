import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import QueryRoot from '../QueryRoot.tsx';
import FormField from '../FormField.tsx';
import { api } from '../../lib/client/api.ts';
import { workTypeCreateSchema } from '../../schemas/work-types.ts';
import { DataTable, TableTools, useServerList, type Column } from './DataTable.tsx';
import RecordActions from './RecordActions.tsx';
import { apiErrors, money, zodErrors } from './format.ts';

interface WorkType { id: number; name: string; minutesPerHorse: number; needsForge: boolean; needsQualified: boolean; priceCents: number; archivedAt: string | null; horses: number }

function WorkTypeForm({ workType, onDone }: { workType: WorkType | null; onDone: () => void }) {
  const client = useQueryClient();
  const [f, setF] = useState({ name: workType?.name ?? '', minutes: String(workType?.minutesPerHorse ?? 30), price: workType ? (workType.priceCents / 100).toFixed(2) : '', needsForge: workType?.needsForge ?? false, needsQualified: workType?.needsQualified ?? false });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const save = useMutation({
    mutationFn: (body: unknown) => (workType ? api(`/api/work-types/${workType.id}`, { method: 'PATCH', body }) : api('/api/work-types', { method: 'POST', body })),
    onSuccess: () => { void client.invalidateQueries(); onDone(); },
    onError: (e) => setErrors(apiErrors(e)),
  });
  function submit(e: FormEvent) {
    e.preventDefault();
    const body = { name: f.name, minutesPerHorse: f.minutes === '' ? undefined : Number(f.minutes), priceCents: f.price === '' ? 0 : Math.round(Number(f.price) * 100), needsForge: f.needsForge, needsQualified: f.needsQualified };
    const parsed = workTypeCreateSchema.safeParse(body);
    if (!parsed.success) return setErrors(zodErrors(parsed.error));
    setErrors({});
    save.mutate(body);
  }
  return (
    <form onSubmit={submit} noValidate className="card space-y-3 p-4" aria-label={workType ? 'Edit work type' : 'Add work type'}>
      <h2>{workType ? `Edit ${workType.name}` : 'Add a work type'}</h2>
      {errors._ && <p role="alert" className="rounded-lg bg-ember-50 px-3 py-2 text-sm text-ember-800">{errors._}</p>}
      <FormField id="wt-name" label="Name" error={errors.name}><input id="wt-name" className="field" value={f.name} onChange={(e) => setF({ ...f, name: e.target.value })} /></FormField>
      <div className="grid grid-cols-2 gap-3">
        <FormField id="wt-minutes" label="Minutes per horse" error={errors.minutesPerHorse}><input id="wt-minutes" type="number" min={1} className="field font-mono" value={f.minutes} onChange={(e) => setF({ ...f, minutes: e.target.value })} /></FormField>
        <FormField id="wt-price" label="Price ($)" error={errors.priceCents}><input id="wt-price" type="number" min={0} step="0.01" className="field font-mono" value={f.price} onChange={(e) => setF({ ...f, price: e.target.value })} /></FormField>
      </div>
      <label className="flex items-center gap-2 text-sm"><input type="checkbox" checked={f.needsForge} onChange={(e) => setF({ ...f, needsForge: e.target.checked })} /> Needs a forge on the truck (hot work)</label>
      <label className="flex items-center gap-2 text-sm"><input type="checkbox" checked={f.needsQualified} onChange={(e) => setF({ ...f, needsQualified: e.target.checked })} /> Needs a farrier qualified for therapeutic work</label>
      {f.needsForge && <p className="caution">Hot fitting means burns, smoke and fumes: keep the forge's gas cylinder upright and away from the horse.</p>}
      {f.needsQualified && <p className="caution">Therapeutic work is done in consultation with the horse's veterinarian.</p>}
      <div className="flex gap-2">
        <button className="btn-primary" type="submit" disabled={save.isPending}>{save.isPending ? 'Saving…' : workType ? 'Save work type' : 'Add work type'}</button>
        <button className="btn-quiet" type="button" onClick={onDone}>Close</button>
      </div>
      {workType && <RecordActions endpoint={`/api/work-types/${workType.id}`} archived={workType.archivedAt !== null} what="work type" onDone={onDone} />}
    </form>
  );
}

function Screen() {
  const [archived, setArchived] = useState('exclude');
  const list = useServerList<WorkType>('/api/work-types', { archived }, 'name');
  const [editing, setEditing] = useState<WorkType | 'new' | null>(null);
  const columns: Column<WorkType>[] = [
    { key: 'name', label: 'Work', sort: 'name', render: (w) => <span className="font-semibold">{w.name}{w.archivedAt && <span className="ml-2 rounded bg-slateblue-100 px-1.5 text-[10px] uppercase">archived</span>}</span> },
    { key: 'minutes', label: 'Minutes', sort: 'minutesPerHorse', className: 'text-right', render: (w) => <span className="figure">{w.minutesPerHorse}</span> },
    { key: 'needs', label: 'Needs', render: (w) => [w.needsForge && 'Forge', w.needsQualified && 'Qualified farrier'].filter(Boolean).join(', ') || '—' },
    { key: 'price', label: 'Price', sort: 'priceCents', className: 'text-right', render: (w) => <span className="figure">{money(w.priceCents)}</span> },
    { key: 'horses', label: 'Horses', sort: 'horses', className: 'text-right', render: (w) => <span className="figure">{w.horses}</span> },
  ];
  return (
    <div className="grid gap-4 lg:grid-cols-[1fr_22rem]">
      <div>
        <TableTools q={list.q} setQ={list.setQ} placeholder="Work type name" archived={archived} setArchived={setArchived}>
          <button type="button" className="btn-primary" onClick={() => setEditing('new')}>Add work type</button>
        </TableTools>
        <DataTable columns={columns} list={list} rowKey={(w) => w.id} onRowClick={(w) => setEditing(w)} selectedKey={editing && editing !== 'new' ? editing.id : null} empty="No work types match." />
      </div>
      <div>
        {editing ? <WorkTypeForm key={editing === 'new' ? 'new' : editing.id} workType={editing === 'new' ? null : editing} onDone={() => setEditing(null)} /> : (
          <p className="text-sm text-slateblue-600">A job's minutes are the sum of its horse's usual work. Changing minutes here applies to jobs created from now on.</p>
        )}
      </div>
    </div>
  );
}

export default function WorkTypesScreen() {
  return <QueryRoot><Screen /></QueryRoot>;
}
