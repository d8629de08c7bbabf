import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import QueryRoot from '../QueryRoot.tsx';
import { api, ApiError } from '../../lib/client/api.ts';
import { IMPORT_FIELDS, MAX_CSV_CHARS } from '../../schemas/import.ts';

interface Headers { headers: string[]; rows: number; mapping: Record<string, string>; sample: Record<string, string>[] }
interface Preview { rows: number; badRows: { line: number; reasons: string[] }[]; newOwners: number; newBarns: number; newHorses: number; unchanged: number; horses: { line: number; name: string; cycleWeeks: number; lastVisitOn: string | null }[] }
interface Committed { owners: number; barns: number; horses: number; unchanged: number; rows: number }

/** Import in three steps: choose a file, map its columns, check the preview, then commit all rows or none. */
function Screen() {
  const [csv, setCsv] = useState<string | null>(null);
  const [fileName, setFileName] = useState('');
  const [headers, setHeaders] = useState<Headers | null>(null);
  const [mapping, setMapping] = useState<Record<string, string>>({});
  const [preview, setPreview] = useState<Preview | null>(null);
  const [done, setDone] = useState<Committed | null>(null);
  const [error, setError] = useState<string | null>(null);
  const fail = (e: unknown) => setError(e instanceof ApiError ? [e.message, ...Object.values(e.fields)].filter((v, i, a) => a.indexOf(v) === i).join(' · ') : 'Could not reach the server');
  const readHeaders = useMutation({ mutationFn: (text: string) => api<Headers>('/api/import/headers', { method: 'POST', body: { csv: text } }), onSuccess: (h) => { setHeaders(h); setMapping(h.mapping); setError(null); }, onError: fail });
  const check = useMutation({ mutationFn: () => api<Preview>('/api/import/preview', { method: 'POST', body: { csv, mapping } }), onSuccess: (p) => { setPreview(p); setError(null); }, onError: fail });
  const commit = useMutation({ mutationFn: () => api<Committed>('/api/import/commit', { method: 'POST', body: { csv, mapping } }), onSuccess: (r) => { setDone(r); setError(null); }, onError: fail });

  async function choose(file: File | undefined) {
    setHeaders(null); setPreview(null); setDone(null); setError(null);
    if (!file) return;
    if (file.size > MAX_CSV_CHARS) return setError('The file is larger than 2 MB');
    const text = await file.text();
    setCsv(text);
    setFileName(file.name);
    readHeaders.mutate(text);
  }

  return (
    <div className="space-y-4">
      <section className="card space-y-2 p-4">
        <h2>1. Choose a CSV file</h2>
        <p className="text-sm text-slateblue-600">One row per horse, with its owner and barn. A barn not on record yet needs an address from the region's address points, or an address with latitude and longitude. Try the <a className="underline" href="/samples/demo-owners.csv" download>sample file of the fictional demo</a>.</p>
        <input id="import-file" type="file" accept=".csv,text/csv" className="text-sm" onChange={(e) => void choose(e.target.files?.[0])} aria-label="CSV file" />
      </section>
      {error && <p role="alert" className="rounded-lg bg-ember-50 px-3 py-2 text-sm text-ember-800">{error}</p>}
      {headers && (
        <section className="card space-y-3 p-4">
          <h2>2. Match the columns</h2>
          <p className="text-sm text-slateblue-600"><span className="font-mono">{fileName}</span>: <span className="figure">{headers.rows}</span> rows.</p>
          <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
            {IMPORT_FIELDS.map((f) => (
              <div key={f.key}>
                <label className="label" htmlFor={`map-${f.key}`}>{f.label}{f.required && ' *'}</label>
                <select id={`map-${f.key}`} className="field" value={mapping[f.key] ?? ''} onChange={(e) => { setMapping({ ...mapping, [f.key]: e.target.value }); setPreview(null); }}>
                  <option value="">{f.required ? 'Choose a column' : 'Not in this file'}</option>
                  {headers.headers.map((h) => <option key={h} value={h}>{h}</option>)}
                </select>
              </div>
            ))}
          </div>
          <button className="btn-primary" type="button" disabled={check.isPending} onClick={() => { setDone(null); check.mutate(); }}>{check.isPending ? 'Checking…' : 'Check the rows'}</button>
        </section>
      )}
      {preview && !done && (
        <section className="card space-y-3 p-4" aria-label="Import preview">
          <h2>3. Preview</h2>
          <ul className="flex flex-wrap gap-4 text-sm">
            <li><span className="figure text-lg">{preview.newOwners}</span> new owners</li>
            <li><span className="figure text-lg">{preview.newBarns}</span> new barns</li>
            <li><span className="figure text-lg">{preview.newHorses}</span> new horses</li>
            <li><span className="figure text-lg">{preview.unchanged}</span> already on record</li>
            <li className={preview.badRows.length ? 'text-ember-800' : ''}><span className="figure text-lg">{preview.badRows.length}</span> rows with problems</li>
          </ul>
          {preview.badRows.length > 0 ? (
            <>
              <p className="text-sm">Nothing is imported while any row has a problem. Fix these lines in the file and choose it again:</p>
              <table className="min-w-full text-sm" aria-label="Rows with problems">
                <thead className="text-left text-xs uppercase tracking-wide text-slateblue-500"><tr><th className="py-1 pr-3">Line</th><th className="py-1">Why</th></tr></thead>
                <tbody>{preview.badRows.map((b) => <tr key={b.line} className="border-t border-slateblue-100"><td className="py-1 pr-3 font-mono">{b.line}</td><td className="py-1">{b.reasons.join('; ')}</td></tr>)}</tbody>
              </table>
            </>
          ) : preview.newHorses === 0 ? (
            <p className="text-sm">Every row is already on record: importing this file again would add nothing.</p>
          ) : (
            <button className="btn-primary" type="button" disabled={commit.isPending} onClick={() => commit.mutate()}>{commit.isPending ? 'Importing…' : `Import ${preview.newHorses} horses`}</button>
          )}
        </section>
      )}
      {done && (
        <p role="status" className="rounded-lg bg-slateblue-50 px-3 py-2 text-sm">
          Imported <span className="figure">{done.horses}</span> horses, <span className="figure">{done.owners}</span> owners and <span className="figure">{done.barns}</span> barns ({done.unchanged} rows already on record). <a className="underline" href="/due">See them on the due list</a>.
        </p>
      )}
    </div>
  );
}

export default function ImportScreen() {
  return <QueryRoot><Screen /></QueryRoot>;
}
