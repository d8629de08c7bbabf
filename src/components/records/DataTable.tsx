import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { useEffect, useState, type ReactNode } from 'react';
import { api } from '../../lib/client/api.ts';
import Pager from './Pager.tsx';

/** One page of a records list, as every list endpoint answers. */
export interface PageOf<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

export interface Column<T> {
  key: string;
  label: string;
  /** The API's sort key, when the column can be sorted. */
  sort?: string;
  className?: string;
  render: (row: T) => ReactNode;
}

/** Search text that waits for a pause in typing before it asks the server. */
export function useDebounced<T>(value: T, ms = 250): T {
  const [v, setV] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setV(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return v;
}

/**
 * Server-side list state: search, sort, direction, page and extra filters become the query string of
 * `endpoint`; the previous page stays on screen while the next one loads.
 */
export function useServerList<T>(endpoint: string, filters: Record<string, string | number | undefined>, initialSort: string) {
  const [q, setQ] = useState('');
  const [sort, setSort] = useState(initialSort);
  const [dir, setDir] = useState<'asc' | 'desc'>('asc');
  const [page, setPage] = useState(1);
  const search = useDebounced(q);
  const params = new URLSearchParams();
  params.set('q', search);
  params.set('sort', sort);
  params.set('dir', dir);
  params.set('page', String(page));
  params.set('pageSize', '25');
  for (const [k, v] of Object.entries(filters)) if (v !== undefined && v !== '') params.set(k, String(v));
  const key = params.toString();
  useEffect(() => setPage(1), [search, JSON.stringify(filters)]);
  const query = useQuery({ queryKey: [endpoint, key], queryFn: ({ signal }) => api<PageOf<T>>(`${endpoint}?${key}`, { signal }), placeholderData: keepPreviousData });
  const toggleSort = (s: string) => {
    if (s === sort) setDir(dir === 'asc' ? 'desc' : 'asc');
    else {
      setSort(s);
      setDir('asc');
    }
  };
  return { q, setQ, sort, dir, toggleSort, page, setPage, query };
}

/** A records table with sortable headers, loading and error states, and paging underneath. */
export function DataTable<T extends { id?: number }>({
  columns, list, rowKey, onRowClick, empty, selectedKey,
}: {
  columns: Column<T>[];
  list: ReturnType<typeof useServerList<T>>;
  rowKey: (row: T) => string | number;
  onRowClick?: (row: T) => void;
  empty: string;
  selectedKey?: string | number | null;
}) {
  const { query, sort, dir, toggleSort, page, setPage } = list;
  const data = query.data;
  const pages = data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1;
  return (
    <div className="card overflow-hidden">
      <div className="overflow-x-auto">
        <table className="min-w-full text-sm">
          <thead className="bg-slateblue-50 text-left text-xs uppercase tracking-wide text-slateblue-600">
            <tr>
              {columns.map((c) => (
                <th key={c.key} scope="col" className={`px-3 py-2 font-semibold ${c.className ?? ''}`} aria-sort={c.sort && sort === c.sort ? (dir === 'asc' ? 'ascending' : 'descending') : undefined}>
                  {c.sort ? (
                    <button type="button" className="inline-flex items-center gap-1 hover:text-ember-700" onClick={() => toggleSort(c.sort!)}>
                      {c.label}
                      <span aria-hidden="true" className="font-mono">{sort === c.sort ? (dir === 'asc' ? '↑' : '↓') : '↕'}</span>
                    </button>
                  ) : c.label}
                </th>
              ))}
            </tr>
          </thead>
          <tbody className={query.isFetching && data ? 'opacity-60' : ''}>
            {query.isError && (
              <tr><td colSpan={columns.length} className="px-3 py-6 text-center text-ember-800" role="alert">Could not load: {(query.error as Error).message}</td></tr>
            )}
            {!data && query.isLoading && (
              <tr><td colSpan={columns.length} className="px-3 py-6 text-center text-slateblue-500">Loading…</td></tr>
            )}
            {data && data.items.length === 0 && (
              <tr><td colSpan={columns.length} className="px-3 py-6 text-center text-slateblue-500">{empty}</td></tr>
            )}
            {data?.items.map((row) => {
              const k = rowKey(row);
              return (
                <tr
                  key={k}
                  className={`border-t border-slateblue-100 ${onRowClick ? 'cursor-pointer hover:bg-hay-50' : ''} ${selectedKey === k ? 'bg-ember-50' : ''}`}
                  onClick={onRowClick ? () => onRowClick(row) : undefined}
                >
                  {columns.map((c) => <td key={c.key} className={`px-3 py-2 align-top ${c.className ?? ''}`}>{c.render(row)}</td>)}
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <Pager page={page} pages={pages} setPage={setPage} summary={<span className="figure" data-testid="table-total">{data ? `${data.total} ${data.total === 1 ? 'record' : 'records'}` : ''}</span>} />
    </div>
  );
}

/** The search box and "show archived" choice above a table. */
export function TableTools({ q, setQ, placeholder, archived, setArchived, children }: { q: string; setQ: (v: string) => void; placeholder: string; archived: string; setArchived: (v: string) => void; children?: ReactNode }) {
  return (
    <div className="mb-3 flex flex-wrap items-end gap-3">
      <div className="min-w-[16rem] flex-1">
        <label className="label" htmlFor="table-search">Search</label>
        <input id="table-search" type="search" className="field" placeholder={placeholder} value={q} onChange={(e) => setQ(e.target.value)} />
      </div>
      {children}
      <div>
        <label className="label" htmlFor="table-archived">Show</label>
        <select id="table-archived" className="field" value={archived} onChange={(e) => setArchived(e.target.value)}>
          <option value="exclude">Current</option>
          <option value="only">Archived</option>
          <option value="include">Current and archived</option>
        </select>
      </div>
    </div>
  );
}
