import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { api } from '../../lib/client/api.ts';
import { useDebounced } from './DataTable.tsx';

export interface AddressHit { id: string; text: string; lat: number; lon: number }

/**
 * An address field with suggestions from the region's own address points (/api/barns/addresses);
 * picking one fills the address and moves the pin. Free text is kept when nothing matches.
 */
export default function AddressLookup({ id, value, onText, onPick, invalid }: { id: string; value: string; onText: (v: string) => void; onPick: (hit: AddressHit) => void; invalid?: boolean }) {
  const [open, setOpen] = useState(false);
  const q = useDebounced(value, 200);
  const hits = useQuery({
    queryKey: ['addresses', q],
    queryFn: ({ signal }) => api<{ addresses: AddressHit[] }>(`/api/barns/addresses?q=${encodeURIComponent(q)}`, { signal }),
    enabled: open && q.trim().length >= 2,
  });
  const list = hits.data?.addresses ?? [];
  return (
    <div className="relative">
      <input
        id={id}
        className="field"
        autoComplete="off"
        aria-invalid={invalid || undefined}
        value={value}
        onChange={(e) => { onText(e.target.value); setOpen(true); }}
        onBlur={() => setTimeout(() => setOpen(false), 150)}
        placeholder="Start typing: house number and road"
      />
      {open && q.trim().length >= 2 && (
        <ul className="absolute z-20 mt-1 max-h-64 w-full overflow-auto rounded-lg border border-slateblue-200 bg-white text-sm shadow" role="listbox" aria-label="Matching addresses">
          {hits.isLoading && <li className="px-3 py-2 text-slateblue-500">Looking up…</li>}
          {!hits.isLoading && list.length === 0 && <li className="px-3 py-2 text-slateblue-500">No address point matches; place the pin by hand.</li>}
          {list.map((a) => (
            <li key={a.id} role="option" aria-selected="false">
              <button type="button" className="block w-full px-3 py-2 text-left hover:bg-hay-50" onMouseDown={(e) => e.preventDefault()} onClick={() => { onPick(a); setOpen(false); }}>{a.text}</button>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
