import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useRef, useState, type FormEvent } from 'react';
import QueryRoot from '../QueryRoot.tsx';
import { api, ApiError } from '../../lib/client/api.ts';

interface Upload { id: number; kind: 'photo' | 'radiograph' | 'document'; fileName: string; mimeType: string; sizeBytes: number; hasThumb: boolean; uploadedBy: string | null; createdAt: string }

const MAX_BYTES = 15 * 1024 * 1024;
const KIND_LABEL = { photo: 'Photo', radiograph: 'Radiograph', document: 'Document' } as const;

async function send(horseId: number, file: File, kind: string): Promise<Upload> {
  const form = new FormData();
  form.set('file', file);
  form.set('kind', kind);
  const response = await fetch(`/api/horses/${horseId}/uploads`, { method: 'POST', body: form, credentials: 'same-origin' });
  const data = await response.json().catch(() => null);
  if (!response.ok) throw new ApiError(response.status, data?.error?.code ?? 'error', data?.error?.message ?? `Upload failed (${response.status})`, data?.error?.fields ?? {});
  return data.upload;
}

function Uploads({ horseId, canWrite }: { horseId: number; canWrite: boolean }) {
  const client = useQueryClient();
  const input = useRef<HTMLInputElement>(null);
  const [kind, setKind] = useState('photo');
  const [error, setError] = useState<string | null>(null);
  const list = useQuery({ queryKey: ['uploads', horseId], queryFn: () => api<{ uploads: Upload[] }>(`/api/horses/${horseId}/uploads`) });
  const upload = useMutation({
    mutationFn: (file: File) => send(horseId, file, kind),
    onSuccess: () => { setError(null); if (input.current) input.current.value = ''; void client.invalidateQueries({ queryKey: ['uploads', horseId] }); },
    onError: (e) => setError(e instanceof ApiError ? e.message : 'Could not reach the server'),
  });
  const remove = useMutation({
    mutationFn: (id: number) => api(`/api/uploads/${id}`, { method: 'DELETE' }),
    onSuccess: () => void client.invalidateQueries({ queryKey: ['uploads', horseId] }),
  });
  function submit(e: FormEvent) {
    e.preventDefault();
    const file = input.current?.files?.[0];
    if (!file) return setError('Choose a file');
    if (file.size > MAX_BYTES) return setError('Files can be at most 15 MB');
    upload.mutate(file);
  }
  const uploads = list.data?.uploads ?? [];
  return (
    <div className="space-y-3">
      {canWrite && (
        <form onSubmit={submit} className="flex flex-wrap items-end gap-2" aria-label="Upload a file">
          <div>
            <label className="label" htmlFor="upload-file">File (JPEG, PNG or PDF, up to 15 MB)</label>
            <input id="upload-file" ref={input} type="file" accept="image/jpeg,image/png,application/pdf" className="text-sm" />
          </div>
          <div>
            <label className="label" htmlFor="upload-kind">Kind</label>
            <select id="upload-kind" className="field" value={kind} onChange={(e) => setKind(e.target.value)}>
              <option value="photo">Photo</option>
              <option value="radiograph">Radiograph</option>
              <option value="document">Document</option>
            </select>
          </div>
          <button className="btn-primary" type="submit" disabled={upload.isPending}>{upload.isPending ? 'Uploading…' : 'Upload'}</button>
        </form>
      )}
      {error && <p role="alert" className="rounded-lg bg-ember-50 px-3 py-2 text-sm text-ember-800">{error}</p>}
      {list.isLoading && <p className="text-sm text-slateblue-500">Loading…</p>}
      {list.data && uploads.length === 0 && <p className="text-sm text-slateblue-600">No photos, radiographs or documents yet.</p>}
      <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4" aria-label="Uploads">
        {uploads.map((u) => (
          <li key={u.id} className="overflow-hidden rounded-lg border border-slateblue-100 bg-white">
            <a href={`/api/uploads/${u.id}`} target="_blank" rel="noopener" className="block">
              {u.hasThumb ? (
                <img src={`/api/uploads/${u.id}?size=thumb`} alt={`${KIND_LABEL[u.kind]}: ${u.fileName}`} className="h-32 w-full bg-slateblue-50 object-cover" loading="lazy" />
              ) : (
                <div className="flex h-32 items-center justify-center bg-slateblue-50 font-mono text-sm text-slateblue-600">PDF</div>
              )}
            </a>
            <div className="px-2 py-1 text-xs">
              <p className="truncate font-semibold" title={u.fileName}>{u.fileName}</p>
              <p className="text-slateblue-500">{KIND_LABEL[u.kind]} · <span className="font-mono">{u.sizeBytes < 1024 * 1024 ? `${Math.max(1, Math.round(u.sizeBytes / 1024))} KB` : `${(u.sizeBytes / 1024 / 1024).toFixed(1)} MB`}</span> · {u.createdAt.slice(0, 10)}</p>
              {canWrite && <button type="button" className="text-ember-800 underline" onClick={() => { if (window.confirm(`Remove ${u.fileName}?`)) remove.mutate(u.id); }}>Remove</button>}
            </div>
          </li>
        ))}
      </ul>
    </div>
  );
}

export default function HorseUploads(props: { horseId: number; canWrite: boolean }) {
  return <QueryRoot><Uploads {...props} /></QueryRoot>;
}
