import { useState } from 'react';
import QueryRoot from '../QueryRoot.tsx';
import { DataTable, TableTools, useServerList, type Column } from './DataTable.tsx';

interface Horse { id: number; name: string; ownerName: string; barnName: string; cycleWeeks: number; lastVisitOn: string | null; nextDueOn: string | null; needsSecondPerson: boolean; archivedAt: string | null; workTypes: { id: number; name: string }[] }
type Option = { id: number; name: string };

function Screen({ barns, workTypes }: { barns: Option[]; workTypes: Option[] }) {
  const [archived, setArchived] = useState('exclude');
  const [barnId, setBarnId] = useState('');
  const [workTypeId, setWorkTypeId] = useState('');
  const list = useServerList<Horse>('/api/horses', { archived, barnId, workTypeId }, 'name');
  const columns: Column<Horse>[] = [
    { key: 'name', label: 'Horse', sort: 'name', render: (h) => <a className="font-semibold text-slateblue-900 hover:text-ember-700" href={`/horses/${h.id}`}>{h.name}{h.needsSecondPerson && <span className="ml-2 rounded bg-hay-200 px-1.5 text-[10px] uppercase" title="Needs a second person">2nd person</span>}{h.archivedAt && <span className="ml-2 rounded bg-slateblue-100 px-1.5 text-[10px] uppercase">archived</span>}</a> },
    { key: 'owner', label: 'Owner', sort: 'owner', render: (h) => h.ownerName },
    { key: 'barn', label: 'Barn', sort: 'barn', render: (h) => h.barnName },
    { key: 'work', label: 'Usual work', render: (h) => h.workTypes.map((w) => w.name).join(', ') },
    { key: 'cycle', label: 'Cycle', sort: 'cycleWeeks', className: 'text-right', render: (h) => <span className="figure">{h.cycleWeeks} wk</span> },
    { key: 'last', label: 'Last visit', sort: 'lastVisitOn', render: (h) => <span className="figure">{h.lastVisitOn ?? '—'}</span> },
    { key: 'next', label: 'Next due', sort: 'nextDueOn', render: (h) => <span className="figure">{h.nextDueOn ?? 'now'}</span> },
  ];
  return (
    <>
      <TableTools q={list.q} setQ={list.setQ} placeholder="Horse, owner or barn name" archived={archived} setArchived={setArchived}>
        <div>
          <label className="label" htmlFor="filter-barn">Barn</label>
          <select id="filter-barn" className="field max-w-[14rem]" value={barnId} onChange={(e) => setBarnId(e.target.value)}>
            <option value="">All barns</option>
            {barns.map((b) => <option key={b.id} value={b.id}>{b.name}</option>)}
          </select>
        </div>
        <div>
          <label className="label" htmlFor="filter-work">Work</label>
          <select id="filter-work" className="field" value={workTypeId} onChange={(e) => setWorkTypeId(e.target.value)}>
            <option value="">All work</option>
            {workTypes.map((w) => <option key={w.id} value={w.id}>{w.name}</option>)}
          </select>
        </div>
      </TableTools>
      <DataTable columns={columns} list={list} rowKey={(h) => h.id} onRowClick={(h) => window.location.assign(`/horses/${h.id}`)} empty="No horses match." />
    </>
  );
}

export default function HorsesScreen(props: { barns: Option[]; workTypes: Option[] }) {
  return <QueryRoot><Screen {...props} /></QueryRoot>;
}
