import { useState } from 'react';
import QueryRoot from '../QueryRoot.tsx';
import { DataTable, TableTools, useServerList, type Column } from './DataTable.tsx';
import { hhmm, WEEKDAYS_SHORT } from './format.ts';

interface Barn { id: number; name: string; ownerName: string | null; address: string; horses: number; setupMinutes: number; accessHours: [number, number][][]; archivedAt: string | null }

function hoursSummary(h: [number, number][][]): string {
  const open = h.map((spans, i) => (spans.length ? `${WEEKDAYS_SHORT[i]} ${spans.map(([s, e]) => `${hhmm(s)}–${hhmm(e)}`).join(', ')}` : null)).filter(Boolean);
  const closed = h.map((spans, i) => (spans.length ? null : WEEKDAYS_SHORT[i])).filter(Boolean);
  const first = h.find((s) => s.length);
  const same = first && h.every((s) => s.length === 0 || JSON.stringify(s) === JSON.stringify(first));
  if (same) return `${first!.map(([s, e]) => `${hhmm(s)}–${hhmm(e)}`).join(', ')}${closed.length ? ` · closed ${closed.join(', ')}` : ''}`;
  return open.join('; ');
}

function Screen() {
  const [archived, setArchived] = useState('exclude');
  const list = useServerList<Barn>('/api/barns', { archived }, 'name');
  const columns: Column<Barn>[] = [
    { key: 'name', label: 'Barn', sort: 'name', render: (b) => <a className="font-semibold text-slateblue-900 hover:text-ember-700" href={`/barns/${b.id}`}>{b.name}{b.archivedAt && <span className="ml-2 rounded bg-slateblue-100 px-1.5 text-[10px] uppercase">archived</span>}</a> },
    { key: 'address', label: 'Address', sort: 'address', render: (b) => b.address },
    { key: 'owner', label: 'Owner', sort: 'owner', render: (b) => b.ownerName ?? <span className="text-slateblue-500">Boarding</span> },
    { key: 'hours', label: 'Open', render: (b) => <span className="font-mono text-xs">{hoursSummary(b.accessHours)}</span> },
    { key: 'horses', label: 'Horses', sort: 'horses', className: 'text-right', render: (b) => <span className="figure">{b.horses}</span> },
  ];
  return (
    <>
      <TableTools q={list.q} setQ={list.setQ} placeholder="Barn name or address" archived={archived} setArchived={setArchived}>
        <a className="btn-primary" href="/barns/new">Add barn</a>
      </TableTools>
      <DataTable columns={columns} list={list} rowKey={(b) => b.id} onRowClick={(b) => window.location.assign(`/barns/${b.id}`)} empty="No barns match." />
    </>
  );
}

export default function BarnsScreen() {
  return <QueryRoot><Screen /></QueryRoot>;
}
