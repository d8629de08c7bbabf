import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { api, ApiError } from '../../lib/client/api.ts';

/**
 * Archive / restore / delete buttons for one record. A refused delete (409) shows the server's reason,
 * which names what still uses the record and suggests archiving.
 */
export default function RecordActions({ endpoint, archived, what, onDone }: { endpoint: string; archived: boolean; what: string; onDone: (deleted: boolean) => void }) {
  const client = useQueryClient();
  const [message, setMessage] = useState<string | null>(null);
  const change = useMutation({
    mutationFn: (action: 'archive' | 'restore' | 'delete') =>
      action === 'delete' ? api(endpoint, { method: 'DELETE' }) : api(endpoint, { method: 'PATCH', body: { archived: action === 'archive' } }),
    onSuccess: (_d, action) => {
      setMessage(null);
      void client.invalidateQueries();
      onDone(action === 'delete');
    },
    onError: (e) => setMessage(e instanceof ApiError ? e.message : 'Could not reach the server'),
  });
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-quiet" disabled={change.isPending} onClick={() => change.mutate(archived ? 'restore' : 'archive')}>{archived ? `Restore ${what}` : `Archive ${what}`}</button>
        <button type="button" className="btn-quiet text-ember-800" disabled={change.isPending} onClick={() => { if (window.confirm(`Delete this ${what} for good?`)) change.mutate('delete'); }}>Delete</button>
      </div>
      {message && <p role="alert" className="rounded-lg bg-ember-50 px-3 py-2 text-sm text-ember-800">{message}</p>}
    </div>
  );
}
