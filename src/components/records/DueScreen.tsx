import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useState, type FormEvent } from 'react';
import QueryRoot from '../QueryRoot.tsx';
import FormField from '../FormField.tsx';
import { api, ApiError } from '../../lib/client/api.ts';
import { jobBatchSchema } from '../../schemas/jobs.ts';
import { useDebounced } from './DataTable.tsx';
import { apiErrors, zodErrors } from './format.ts';
import Pager from './Pager.tsx';

type Bucket = 'all' | 'overdue' | 'this_week' | 'later';
interface DueHorse { horseId: number; horseName: string; ownerName: string; barnId: number; barnName: string; cycleWeeks: number; lastVisitOn: string | null; nextDueOn: string | null; bucket: Exclude<Bucket, 'all'>; lastFarrierName: string | null; work: string[]; minutes: number; needsSecondPerson: boolean; openJob: { id: number; state: string; dueOn: string } | null }
interface DueAnswer { today: string; items: DueHorse[]; counts: Record<Bucket, number>; total: number; page: number; pageSize: number }
type Option = { id: number; name: string };

const TABS: { key: Bucket; label: string }[] = [
  { key: 'all', label: 'All' }, { key: 'overdue', label: 'Overdue' }, { key: 'this_week', label: 'Due this week' }, { key: 'later', label: 'Later' },
];
const BADGE = { overdue: 'bg-ember-100 text-ember-800', this_week: 'bg-hay-200 text-slateblue-900', later: 'bg-slateblue-100 text-slateblue-700' };
const BADGE_LABEL = { overdue: 'Overdue', this_week: 'This week', later: 'Later' };
const JOB_LABEL: Record<string, string> = { due: 'Job due', planned: 'Planned', booked: 'Booked', in_progress: 'In progress' };

const addDays = (iso: string, n: number) => { const d = new Date(`${iso}T00:00:00Z`); d.setUTCDate(d.getUTCDate() + n); return d.toISOString().slice(0, 10); };

function CreateJobs({ today, filters, onDone }: { today: string; filters: { barnId?: number; farrierId?: number; workTypeId?: number }; onDone: (msg: string) => void }) {
  const client = useQueryClient();
  const [from, setFrom] = useState(today);
  const [to, setTo] = useState(addDays(today, 7));
  const [includeOverdue, setIncludeOverdue] = useState(true);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const run = useMutation({
    mutationFn: (body: unknown) => api<{ created: number; alreadyOpen: number; withoutWork: number }>('/api/jobs/batch', { method: 'POST', body }),
    onSuccess: (r) => {
      void client.invalidateQueries();
      onDone(`${r.created} ${r.created === 1 ? 'job' : 'jobs'} created${r.alreadyOpen ? `; ${r.alreadyOpen} already had an open job` : ''}${r.withoutWork ? `; ${r.withoutWork} without usual work skipped` : ''}.`);
    },
    onError: (e) => setErrors(apiErrors(e)),
  });
  function submit(e: FormEvent) {
    e.preventDefault();
    const body = { from, to, includeOverdue, ...filters };
    const parsed = jobBatchSchema.safeParse(body);
    if (!parsed.success) return setErrors(zodErrors(parsed.error));
    setErrors({});
    run.mutate(body);
  }
  return (
    <form onSubmit={submit} noValidate className="card flex flex-wrap items-end gap-3 p-4" aria-label="Create jobs for a date range">
      <div className="w-full"><h2>Create jobs for a date range</h2><p className="text-xs text-slateblue-600">One job per horse due in the range (with the filters above), minutes from its usual work. Horses that already have an open job are left as they are. Dispatch plans from these jobs.</p></div>
      <FormField id="batch-from" label="Due from" error={errors.from}><input id="batch-from" type="date" className="field font-mono" value={from} onChange={(e) => setFrom(e.target.value)} /></FormField>
      <FormField id="batch-to" label="Due to" error={errors.to}><input id="batch-to" type="date" className="field font-mono" value={to} onChange={(e) => setTo(e.target.value)} /></FormField>
      <label className="flex items-center gap-2 pb-2 text-sm"><input type="checkbox" checked={includeOverdue} onChange={(e) => setIncludeOverdue(e.target.checked)} /> Include overdue horses</label>
      <button className="btn-primary" type="submit" disabled={run.isPending}>{run.isPending ? 'Creating…' : 'Create jobs'}</button>
      {errors._ && <p role="alert" className="w-full text-sm text-ember-800">{errors._}</p>}
    </form>
  );
}

function Screen({ barns, farriers, workTypes }: { barns: Option[]; farriers: Option[]; workTypes: Option[] }) {
  const client = useQueryClient();
  const [bucket, setBucket] = useState<Bucket>('all');
  const [barnId, setBarnId] = useState('');
  const [farrierId, setFarrierId] = useState('');
  const [workTypeId, setWorkTypeId] = useState('');
  const [q, setQ] = useState('');
  const [page, setPage] = useState(1);
  const [notice, setNotice] = useState<string | null>(null);
  const search = useDebounced(q);
  useEffect(() => setPage(1), [bucket, barnId, farrierId, workTypeId, search]);
  const params = new URLSearchParams({ bucket, q: search, page: String(page), pageSize: '50' });
  if (barnId) params.set('barnId', barnId);
  if (farrierId) params.set('farrierId', farrierId);
  if (workTypeId) params.set('workTypeId', workTypeId);
  const due = useQuery({ queryKey: ['due', params.toString()], queryFn: ({ signal }) => api<DueAnswer>(`/api/jobs/due?${params}`, { signal }), placeholderData: keepPreviousData });
  const one = useMutation({
    mutationFn: (horseId: number) => api('/api/jobs', { method: 'POST', body: { horseId } }),
    onSuccess: () => { setNotice('Job created.'); void client.invalidateQueries(); },
    onError: (e) => { setNotice(e instanceof ApiError ? e.message : 'Could not reach the server'); void client.invalidateQueries(); },
  });
  const data = due.data;
  const pages = data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1;
  const filters = { barnId: barnId ? Number(barnId) : undefined, farrierId: farrierId ? Number(farrierId) : undefined, workTypeId: workTypeId ? Number(workTypeId) : undefined };
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-3">
        <div className="min-w-[14rem] flex-1"><label className="label" htmlFor="due-q">Search</label><input id="due-q" type="search" className="field" placeholder="Horse, barn or owner" value={q} onChange={(e) => setQ(e.target.value)} /></div>
        <div><label className="label" htmlFor="due-barn">Barn</label><select id="due-barn" className="field max-w-[14rem]" value={barnId} onChange={(e) => setBarnId(e.target.value)}><option value="">All barns</option>{barns.map((b) => <option key={b.id} value={b.id}>{b.name}</option>)}</select></div>
        <div><label className="label" htmlFor="due-farrier">Last done by</label><select id="due-farrier" className="field" value={farrierId} onChange={(e) => setFarrierId(e.target.value)}><option value="">Any farrier</option>{farriers.map((f) => <option key={f.id} value={f.id}>{f.name}</option>)}</select></div>
        <div><label className="label" htmlFor="due-work">Work</label><select id="due-work" className="field" value={workTypeId} onChange={(e) => setWorkTypeId(e.target.value)}><option value="">All work</option>{workTypes.map((w) => <option key={w.id} value={w.id}>{w.name}</option>)}</select></div>
      </div>
      <div role="tablist" className="flex flex-wrap gap-1">
        {TABS.map((t) => (
          <button key={t.key} role="tab" aria-selected={bucket === t.key} type="button" onClick={() => setBucket(t.key)} className={`rounded-full px-4 py-1.5 text-sm font-semibold ${bucket === t.key ? 'bg-slateblue-900 text-white' : 'bg-white text-slateblue-700 ring-1 ring-slateblue-200 hover:bg-slateblue-50'}`}>
            {t.label} <span className="figure ml-1 opacity-80">{data ? data.counts[t.key] : '…'}</span>
          </button>
        ))}
      </div>
      {notice && <p role="status" className="rounded-lg bg-slateblue-50 px-3 py-2 text-sm">{notice}</p>}
      <div className="card overflow-hidden">
        <div className="overflow-x-auto">
          <table className="min-w-full text-sm" aria-label="Due horses">
            <thead className="bg-slateblue-50 text-left text-xs uppercase tracking-wide text-slateblue-600">
              <tr><th className="px-3 py-2">Next due</th><th className="px-3 py-2">Horse</th><th className="px-3 py-2">Barn</th><th className="px-3 py-2">Work</th><th className="px-3 py-2 text-right">Min</th><th className="px-3 py-2">Last visit</th><th className="px-3 py-2">Last done by</th><th className="px-3 py-2">Job</th></tr>
            </thead>
            <tbody className={due.isFetching && data ? 'opacity-60' : ''}>
              {due.isError && <tr><td colSpan={8} className="px-3 py-6 text-center text-ember-800" role="alert">Could not load: {(due.error as Error).message}</td></tr>}
              {!data && due.isLoading && <tr><td colSpan={8} className="px-3 py-6 text-center text-slateblue-500">Loading…</td></tr>}
              {data && data.items.length === 0 && <tr><td colSpan={8} className="px-3 py-6 text-center text-slateblue-500">No horses match.</td></tr>}
              {data?.items.map((h) => (
                <tr key={h.horseId} className="border-t border-slateblue-100" data-horse={h.horseName}>
                  <td className="whitespace-nowrap px-3 py-2"><span className={`mr-2 rounded px-1.5 py-0.5 text-[10px] font-semibold uppercase ${BADGE[h.bucket]}`}>{BADGE_LABEL[h.bucket]}</span><span className="figure">{h.nextDueOn ?? 'now'}</span></td>
                  <td className="px-3 py-2"><a className="font-semibold hover:text-ember-700" href={`/horses/${h.horseId}`}>{h.horseName}</a>{h.needsSecondPerson && <span className="ml-1 rounded bg-hay-200 px-1 text-[10px] uppercase" title="Needs a second person">2nd</span>}<div className="text-xs text-slateblue-500">{h.ownerName}</div></td>
                  <td className="px-3 py-2">{h.barnName}</td>
                  <td className="px-3 py-2">{h.work.join(', ') || '—'}</td>
                  <td className="px-3 py-2 text-right figure">{h.minutes}</td>
                  <td className="whitespace-nowrap px-3 py-2 figure">{h.lastVisitOn ?? '—'}</td>
                  <td className="px-3 py-2">{h.lastFarrierName ?? '—'}</td>
                  <td className="px-3 py-2">{h.openJob ? <span className="whitespace-nowrap text-xs font-semibold text-slateblue-700">{JOB_LABEL[h.openJob.state] ?? h.openJob.state} <span className="font-mono font-normal">{h.openJob.dueOn}</span></span> : <button type="button" className="btn-quiet px-2 py-1 text-xs" disabled={one.isPending} onClick={() => one.mutate(h.horseId)}>Create job</button>}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <Pager page={page} pages={pages} setPage={setPage} summary={<span className="figure">{data ? `${data.total} horses · today is ${data.today} (practice time)` : ''}</span>} />
      </div>
      {data && <CreateJobs today={data.today} filters={filters} onDone={setNotice} />}
    </div>
  );
}

export default function DueScreen(props: { barns: Option[]; farriers: Option[]; workTypes: Option[] }) {
  return <QueryRoot><Screen {...props} /></QueryRoot>;
}
