import { useQuery } from '@tanstack/react-query';
import { useEffect, useMemo, useState } from 'react';
import {
  Bar, BarChart, CartesianGrid, Cell, ComposedChart, Legend, Line, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis,
} from 'recharts';
import QueryRoot from '../QueryRoot.tsx';
import { api } from '../../lib/client/api.ts';
import type { ReviewResult } from '../../lib/review/compute.ts';
import { REVIEW_COLUMNS, columnHeading, displayFigure, formatMinutes } from '../../lib/review/table.ts';
import { addDays, monthOf, weekOf } from '../../lib/review/time.ts';
import { unitLabel } from '../../lib/review/mileage.ts';

export type ReviewMode = 'week' | 'month';

interface Props {
  /** First day of the range shown first (a week start or a month's first day). */
  from: string;
  mode: ReviewMode;
  weekStart: number;
  today: string;
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
const DAYS = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'];
/** '2026-03-02' → '2 Mar'. */
const shortDate = (d: string) => `${Number(d.slice(8, 10))} ${MONTHS[Number(d.slice(5, 7)) - 1]}`;
const dayLabel = (d: string) => `${DAYS[new Date(`${d}T00:00:00Z`).getUTCDay()]} ${shortDate(d)}`;
const hours = (m: number) => Math.round((m / 60) * 100) / 100;
/** Weeks in order, light to dark, so a month reads left to right within each farrier. */
const WEEK_SHADES = ['#e9d8a3', '#d2a947', '#a2b3c6', '#748ca8', '#445a76', '#1f2833'];

function rangeOf(from: string, mode: ReviewMode, weekStart: number) {
  return mode === 'week' ? weekOf(from, weekStart) : monthOf(from);
}

function Review({ from: initialFrom, mode: initialMode, weekStart, today }: Props) {
  const [mode, setMode] = useState<ReviewMode>(initialMode);
  const [anchor, setAnchor] = useState(initialFrom);
  const range = rangeOf(anchor, mode, weekStart);
  const [farrierId, setFarrierId] = useState<number | null>(null);
  const review = useQuery({
    queryKey: ['review', range.from, range.to],
    queryFn: () => api<ReviewResult>(`/api/review?from=${range.from}&to=${range.to}`),
  });

  useEffect(() => {
    const url = new URL(window.location.href);
    url.searchParams.set('from', range.from);
    url.searchParams.set('mode', mode);
    window.history.replaceState(null, '', url);
  }, [range.from, mode]);

  function step(direction: 1 | -1) {
    if (mode === 'week') setAnchor(addDays(range.from, 7 * direction));
    else {
      const d = new Date(`${range.from}T00:00:00Z`);
      d.setUTCMonth(d.getUTCMonth() + direction);
      setAnchor(d.toISOString().slice(0, 10));
    }
  }

  const title = mode === 'week' ? `Week of ${dayLabel(range.from)} – ${dayLabel(range.to)}` : `${MONTHS[Number(range.from.slice(5, 7)) - 1]} ${range.from.slice(0, 4)}`;
  const data = review.data;

  return (
    <div className="min-w-0 space-y-6">
      <div className="flex flex-wrap items-end gap-3">
        <div className="inline-flex overflow-hidden rounded-lg border border-slateblue-200 bg-white text-sm" role="group" aria-label="Range">
          {(['week', 'month'] as const).map((m) => (
            <button key={m} type="button" aria-pressed={mode === m} onClick={() => { setMode(m); setAnchor(range.from); }}
              className={`px-3 py-2 font-semibold ${mode === m ? 'bg-slateblue-800 text-white' : 'text-slateblue-700 hover:bg-slateblue-50'}`}>
              {m === 'week' ? 'Week' : 'Month'}
            </button>
          ))}
        </div>
        <button type="button" className="btn-quiet" onClick={() => step(-1)} aria-label={`Previous ${mode}`}>←</button>
        <h2 className="min-w-[16rem] text-center" data-testid="range-title">{title}</h2>
        <button type="button" className="btn-quiet" onClick={() => step(1)} aria-label={`Next ${mode}`} disabled={range.to >= today && range.from > today}>→</button>
        <label className="text-sm">
          <span className="label">Go to</span>
          <input type="date" className="field figure" value={range.from} max={today} onChange={(e) => e.target.value && setAnchor(e.target.value)} />
        </label>
        <a className="btn-primary ml-auto" href={`/api/review/csv?from=${range.from}&to=${range.to}`} download data-testid="csv-link">Download CSV</a>
      </div>

      {review.isPending && <p className="text-sm text-slateblue-500">Loading the review…</p>}
      {review.isError && <p role="alert" className="text-sm text-ember-800">Could not load the review: {review.error.message}</p>}
      {data && <ReviewBody data={data} mode={mode} farrierId={farrierId} onFarrier={setFarrierId} />}
    </div>
  );
}

function ruleText(data: ReviewResult): string {
  const r = data.rule;
  const parts = [`over ${formatMinutes(r.weeklyMinutes)} h a week at ${r.weeklyMultiplier}×`];
  if (r.dailyMinutes != null && r.dailyMultiplier != null) parts.push(`over ${formatMinutes(r.dailyMinutes)} h a day at ${r.dailyMultiplier}×`);
  if (r.dailyDoubleMinutes != null && r.dailyDoubleMultiplier != null) parts.push(`over ${formatMinutes(r.dailyDoubleMinutes)} h a day at ${r.dailyDoubleMultiplier}×`);
  return parts.join('; ');
}

function ReviewBody({ data, mode, farrierId, onFarrier }: { data: ReviewResult; mode: ReviewMode; farrierId: number | null; onFarrier: (id: number | null) => void }) {
  const unit = unitLabel(data.units);
  const money = (v: number) => new Intl.NumberFormat('en-US', { style: 'currency', currency: data.currency }).format(v);
  const t = data.totals;
  useEffect(() => {
    if (farrierId != null) document.querySelector('[data-testid=farrier-days]')?.scrollIntoView({ behavior: 'smooth', block: 'start' });
  }, [farrierId]);
  const names = new Map(data.farriers.map((f) => [f.farrierId, f]));
  const thresholdH = data.rule.weeklyMinutes / 60;

  const hoursData = useMemo(() => data.farriers.map((f) => {
    const row: Record<string, number | string> = { farrierId: f.farrierId, name: f.name.split(' ')[0]!, colour: f.colour };
    if (mode === 'week') {
      const w = data.weeks[0]?.farriers.find((x) => x.farrierId === f.farrierId);
      row.planned = hours(w?.plannedMinutes ?? 0);
      row.actual = hours(w?.actualMinutes ?? 0);
    } else {
      data.weeks.forEach((week, i) => { row[`w${i}`] = hours(week.farriers.find((x) => x.farrierId === f.farrierId)?.actualMinutes ?? 0); });
    }
    return row;
  }), [data, mode]);

  const distanceData = useMemo(() => data.days.map((d) => {
    const row: Record<string, number | string> = { date: d.date, label: mode === 'week' ? dayLabel(d.date) : shortDate(d.date) };
    let planned = 0;
    for (const f of d.farriers) { row[`f${f.farrierId}`] = f.actualDistance; planned += f.plannedDistance; }
    row.planned = Math.round(planned * 10) / 10;
    return row;
  }), [data, mode]);

  const openDay = (date: string, id?: number) => { window.location.href = `/review/day/${date}${id ? `?farrier=${id}` : ''}`; };
  const clickFarrier = (entry: unknown) => {
    const id = Number((entry as { payload?: { farrierId?: number } })?.payload?.farrierId);
    if (id) onFarrier(id);
  };
  const selected = farrierId != null ? names.get(farrierId) : undefined;

  if (data.farriers.length === 0) return <p className="card p-4 text-sm">No farrier in this practice yet.</p>;

  return (
    <>
      <section className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4" aria-label="Team figures">
        <Tile label="Team hours, actual" value={formatMinutes(t.actualMinutes)} note={`planned ${formatMinutes(t.plannedMinutes)}`} />
        <Tile label="Overtime, actual" value={formatMinutes(t.overtimeMinutes)} note={`${money(t.overtimeCost)} · planned ${formatMinutes(t.plannedOvertimeMinutes)}`} />
        <Tile label={`Distance, actual (${unit})`} value={displayFigure({ key: 'actualDistance', label: '', kind: 'distance', group: 'Distance' }, t.actualDistance, data.currency)} note={`${money(t.mileageCost)} at ${money(data.mileageRate)}/${unit}`} />
        <Tile label="Revenue" value={money(t.revenue)} note={`${t.horsesDone} ${t.horsesDone === 1 ? 'horse' : 'horses'} done · ${t.stopsSkipped} ${t.stopsSkipped === 1 ? 'stop' : 'stops'} skipped`} />
      </section>

      <p className="text-xs text-slateblue-600">
        Overtime rule: <span className="figure">{ruleText(data)}</span>; weeks stand alone. Change it in <a className="underline" href="/settings">Settings</a>.
      </p>

      <div className="grid grid-cols-1 gap-6 xl:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <section className="card min-w-0 p-4" aria-label="Hours against the overtime line">
          <h2>Hours per farrier {mode === 'month' ? 'per week' : ''}</h2>
          <p className="mb-2 text-xs text-slateblue-500">Bars: working hours{mode === 'week' ? ', planned and actual' : ' each week (actual; weeks that overlap the month are shown whole)'}; the line is the weekly overtime threshold. Click a farrier for their days.</p>
          <div className="h-72" data-testid="hours-chart">
            <ResponsiveContainer width="100%" height="100%">
              <BarChart data={hoursData} margin={{ top: 16, right: 12, bottom: 0, left: 0 }}>
                <CartesianGrid strokeDasharray="3 3" stroke="#e3e8ee" />
                <XAxis dataKey="name" tick={{ fontSize: 12 }} />
                <YAxis unit=" h" tick={{ fontSize: 11, fontFamily: 'Roboto Mono' }} width={52}
                  domain={[0, (dataMax: number) => Math.ceil(Math.max(dataMax, thresholdH * 1.1) / 4) * 4]} allowDecimals={false} />
                <Tooltip formatter={(v) => formatMinutes(Math.round(Number(v) * 60))} />
                <Legend wrapperStyle={{ fontSize: 12 }} itemSorter="dataKey" formatter={(value) => <span style={{ color: '#324051' }}>{value}</span>} />
                {mode === 'week' ? (
                  <>
                    <Bar dataKey="planned" name="Planned" fill="#c9d3de" onClick={clickFarrier} cursor="pointer" />
                    <Bar dataKey="actual" name="Actual" fill="#445a76" onClick={clickFarrier} cursor="pointer">
                      {hoursData.map((row) => <Cell key={String(row.farrierId)} fill={String(row.colour)} />)}
                    </Bar>
                  </>
                ) : (
                  data.weeks.map((w, i) => (
                    <Bar key={w.from} dataKey={`w${i}`} name={`Week of ${shortDate(w.from)}`} fill={WEEK_SHADES[i % WEEK_SHADES.length]} onClick={clickFarrier} cursor="pointer" />
                  ))
                )}
                <ReferenceLine y={thresholdH} stroke="#e53708" strokeDasharray="6 3" strokeWidth={2}
                  label={{ value: `Overtime from ${formatMinutes(data.rule.weeklyMinutes)} h`, position: 'insideTopRight', fill: '#971f10', fontSize: 11 }} />
              </BarChart>
            </ResponsiveContainer>
          </div>
        </section>

        <section className="card min-w-0 p-4" aria-label="Distance per day">
          <h2>Distance per day ({unit})</h2>
          <p className="mb-2 text-xs text-slateblue-500">Bars: actual distance per farrier; the line is the planned total. Click a day to open its plan and actuals.</p>
          <div className="h-72" data-testid="distance-chart">
            <ResponsiveContainer width="100%" height="100%">
              <ComposedChart data={distanceData} margin={{ top: 16, right: 12, bottom: 0, left: 0 }}
                onClick={(state: unknown) => {
                  const label = (state as { activeLabel?: string; activeIndex?: number | string } | null);
                  const idx = label?.activeIndex != null ? Number(label.activeIndex) : -1;
                  const row = idx >= 0 ? distanceData[idx] : distanceData.find((r) => r.label === label?.activeLabel);
                  if (row) openDay(String(row.date));
                }}>
                <CartesianGrid strokeDasharray="3 3" stroke="#e3e8ee" />
                <XAxis dataKey="label" tick={{ fontSize: 11 }} interval={mode === 'week' ? 0 : 'preserveStartEnd'} />
                <YAxis tick={{ fontSize: 11, fontFamily: 'Roboto Mono' }} width={48} />
                <Tooltip formatter={(v) => `${Number(v).toFixed(1)} ${unit}`} />
                <Legend wrapperStyle={{ fontSize: 12 }} itemSorter="dataKey" formatter={(value) => <span style={{ color: '#324051' }}>{value}</span>} />
                {data.farriers.map((f) => (
                  <Bar key={f.farrierId} dataKey={`f${f.farrierId}`} name={f.name.split(' ')[0]} stackId="actual" fill={f.colour} cursor="pointer" />
                ))}
                <Line dataKey="planned" name="Planned (team)" stroke="#1f2833" strokeDasharray="4 3" dot={false} type="monotone" />
              </ComposedChart>
            </ResponsiveContainer>
          </div>
        </section>
      </div>

      <section className="card overflow-x-auto" aria-label="Review table">
        <table className="w-full min-w-[64rem] text-sm" data-testid="review-table">
          <thead className="bg-slateblue-50 text-left text-xs uppercase tracking-wide text-slateblue-500">
            <tr>
              <th className="px-3 py-2" rowSpan={2}>Farrier</th>
              {groupSpans().map(([group, span]) => <th key={group} colSpan={span} className="border-l border-slateblue-100 px-3 pt-2 text-center">{group}</th>)}
            </tr>
            <tr>
              {REVIEW_COLUMNS.map((c, i) => (
                <th key={c.key} title={columnHeading(c, data)} className={`px-3 py-2 text-right font-semibold normal-case tracking-normal ${i === 0 || REVIEW_COLUMNS[i - 1]!.group !== c.group ? 'border-l border-slateblue-100' : ''}`}>
                  {c.label}{c.kind === 'distance' ? ` (${unit})` : ''}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {data.farriers.map((f) => (
              <tr key={f.farrierId} className={`border-t border-slateblue-100 ${farrierId === f.farrierId ? 'bg-hay-100' : ''}`}>
                <th scope="row" className="px-3 py-2 text-left font-semibold">
                  <button type="button" className="flex items-center gap-2 whitespace-nowrap hover:underline" onClick={() => onFarrier(f.farrierId)} data-testid={`farrier-${f.farrierId}`}>
                    <span className="inline-block h-2.5 w-2.5 rounded-full" style={{ background: f.colour }} aria-hidden="true" />{f.name}
                  </button>
                </th>
                {REVIEW_COLUMNS.map((c) => <Figure key={c.key} value={displayFigure(c, f[c.key], data.currency)} warn={c.key === 'overtimeMinutes' && f.overtimeMinutes > 0} />)}
              </tr>
            ))}
          </tbody>
          <tfoot>
            <tr className="border-t-2 border-slateblue-200 bg-slateblue-50 font-semibold">
              <th scope="row" className="px-3 py-2 text-left">Team total</th>
              {REVIEW_COLUMNS.map((c) => <Figure key={c.key} value={displayFigure(c, t[c.key], data.currency)} />)}
            </tr>
          </tfoot>
        </table>
        <p className="px-3 py-2 text-xs text-slateblue-600" data-testid="distance-source-note">
          Actual distance is measured when the farrier gave odometer readings at Start the day and Back home.
          <span className="font-semibold"> Days at planned distance</span> had no readings, so they count the planned route's distance.
        </p>
      </section>

      {selected && <FarrierDays data={data} farrierId={selected.farrierId} onClose={() => onFarrier(null)} />}
    </>
  );
}

function groupSpans(): [string, number][] {
  const spans: [string, number][] = [];
  for (const c of REVIEW_COLUMNS) {
    const last = spans[spans.length - 1];
    if (last && last[0] === c.group) last[1] += 1;
    else spans.push([c.group, 1]);
  }
  return spans;
}

function Figure({ value, warn = false }: { value: string; warn?: boolean }) {
  return <td className={`figure border-l border-transparent px-3 py-2 text-right ${warn ? 'text-ember-700' : ''}`}>{value}</td>;
}

function Tile({ label, value, note }: { label: string; value: string; note: string }) {
  return (
    <div className="card p-4">
      <p className="label">{label}</p>
      <p className="figure text-2xl font-medium">{value}</p>
      <p className="figure mt-1 text-xs text-slateblue-500">{note}</p>
    </div>
  );
}

function FarrierDays({ data, farrierId, onClose }: { data: ReviewResult; farrierId: number; onClose: () => void }) {
  const f = data.farriers.find((x) => x.farrierId === farrierId)!;
  const unit = unitLabel(data.units);
  const days = data.days.map((d) => ({ date: d.date, row: d.farriers.find((x) => x.farrierId === farrierId) })).filter((d) => d.row);
  return (
    <section className="card overflow-x-auto" aria-label={`Days of ${f.name}`} data-testid="farrier-days">
      <div className="flex items-center justify-between px-4 pt-4">
        <h2>{f.name}: day by day</h2>
        <button type="button" className="btn-quiet" onClick={onClose}>Close</button>
      </div>
      {days.length === 0 ? <p className="p-4 text-sm">No planned or worked day in this range.</p> : (
        <table className="mt-2 w-full text-sm">
          <thead className="bg-slateblue-50 text-left text-xs uppercase tracking-wide text-slateblue-500">
            <tr>
              <th className="px-3 py-2">Day</th><th className="px-3 py-2 text-right">Planned hours</th><th className="px-3 py-2 text-right">Actual hours</th>
              <th className="px-3 py-2 text-right">Overtime</th><th className="px-3 py-2 text-right">Planned ({unit})</th><th className="px-3 py-2 text-right">Actual ({unit})</th><th className="px-3 py-2" />
            </tr>
          </thead>
          <tbody>
            {days.map(({ date, row }) => (
              <tr key={date} className="border-t border-slateblue-100">
                <td className="figure px-3 py-2">{dayLabel(date)}</td>
                <td className="figure px-3 py-2 text-right">{formatMinutes(row!.plannedMinutes)}</td>
                <td className="figure px-3 py-2 text-right">{formatMinutes(row!.actualMinutes)}</td>
                <td className={`figure px-3 py-2 text-right ${row!.overtimeMinutes > 0 ? 'text-ember-700' : ''}`}>{formatMinutes(row!.overtimeMinutes)}</td>
                <td className="figure px-3 py-2 text-right">{row!.plannedDistance.toFixed(1)}</td>
                <td className="figure px-3 py-2 text-right" data-distance-source={row!.actualDistanceSource ?? ''}>
                  {row!.actualDistance.toFixed(1)}
                  {row!.actualDistanceSource && <span className="ml-1 font-sans text-xs text-slateblue-500">{row!.actualDistanceSource === 'odometer' ? 'odometer' : 'planned'}</span>}
                </td>
                <td className="px-3 py-2 text-right"><a className="text-ember-700 underline" href={`/review/day/${date}?farrier=${farrierId}`}>Open day</a></td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}

/** The lead's review island: range picker, charts, the comparison table and the CSV download. */
export default function ReviewBoard(props: Props) {
  return (
    <QueryRoot>
      <Review {...props} />
    </QueryRoot>
  );
}
