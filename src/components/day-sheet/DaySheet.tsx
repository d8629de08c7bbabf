/**
 * The farrier's day sheet (client:load): one column, large type, big buttons for one thumb. Server
 * rendered with the whole day, so it reads and prints without JavaScript; once hydrated it marks
 * stops, keeps marks in an offline queue and re-estimates the stops ahead from the actual times.
 * The day itself is marked too: Start the day (leaving home) and Back home, with odometer readings.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { DaySheet as Sheet, DaySheetLeg, DaySheetStop } from '../../lib/day-sheet/day-sheet';
import { reestimate, type StopMark } from '../../lib/day-sheet/reestimate';
import type { DayLogView } from '../../lib/day-sheet/day-logs';
import { isDayMark, newClientKey, readQueue, sendMark, writeQueue, type QueuedDayMark, type QueuedMark, type QueuedStopMark } from './mark-queue';
import DayMarks from './DayMarks';
import { refreshKeptCopy } from './offline-copy';
import { dayText } from '../../lib/messaging/local-time';

interface Props {
  sheet: Sheet;
  timeZone: string;
  units: 'miles' | 'km';
  /** Whether the viewer may mark stops (the farrier, or a dispatcher/lead on a published day). */
  canMark: boolean;
  skipReasons: readonly string[];
  /** When the server rendered this page: a copy the phone kept for a dead spot says how old it is. */
  renderedAt: string;
}

type MarkState = 'arrived' | 'done' | 'skipped';

function clock(iso: string | number, timeZone: string): string {
  return new Intl.DateTimeFormat('en-US', { timeZone, hour: 'numeric', minute: '2-digit' }).format(new Date(iso)).replace(' AM', 'am').replace(' PM', 'pm');
}

/** "at 7:02am" for a page loaded today, "Tue 14 Jul, 7:02am" for an older copy. */
function loadedAt(iso: string, timeZone: string): string {
  const day = (t: number) => new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(t);
  const at = Date.parse(iso);
  if (day(at) === day(Date.now())) return `at ${clock(iso, timeZone)}`;
  return `${dayText(new Date(at), timeZone)}, ${clock(iso, timeZone)}`;
}

function duration(sec: number): string {
  const min = Math.round(sec / 60);
  if (min < 60) return `${min} min`;
  return `${Math.floor(min / 60)} h ${String(min % 60).padStart(2, '0')} min`;
}

function distance(m: number, units: 'miles' | 'km'): string {
  if (units === 'miles') {
    const mi = m / 1609.344;
    return mi < 0.1 ? `${Math.max(50, Math.round((m * 3.28084) / 50) * 50)} ft` : `${mi < 10 ? mi.toFixed(1) : Math.round(mi)} mi`;
  }
  return m < 1000 ? `${Math.round(m / 10) * 10} m` : `${(m / 1000).toFixed(1)} km`;
}

function cautionsOf(stop: DaySheetStop): { key: string; text: string }[] {
  const out: { key: string; text: string }[] = [];
  const work = stop.horses.flatMap((h) => h.work);
  if (work.some((w) => w.needsForge)) out.push({ key: 'hot', text: 'Hot fit: burns and hoof smoke. Set the gas forge up outside, check hose and valve, keep an extinguisher at hand.' });
  if (stop.horses.some((h) => h.needsSecondPerson)) out.push({ key: 'second', text: 'A horse here needs a second person to hold it: do not start alone. Sedation only by a vet.' });
  if (work.some((w) => w.needsQualified) || stop.horses.some((h) => h.lame)) out.push({ key: 'vet', text: "Therapeutic or lameness work: follow the horse's vet; ask before changing the plan." });
  return out;
}

function Directions({ leg, units, label, open }: { leg: DaySheetLeg; units: 'miles' | 'km'; label: string; open: boolean }) {
  return (
    <details className="directions mt-3 rounded-lg bg-slateblue-50 px-3 py-2" open={open}>
      <summary className="cursor-pointer select-none py-1 text-base font-semibold">
        {label} · <span className="figure">{distance(leg.distanceM, units)}</span>, <span className="figure">{duration(leg.durationSec)}</span>
      </summary>
      {leg.fallback && <p className="caution mt-2">One end is off the road map: this is a straight-line estimate, follow the barn's own directions.</p>}
      <ol className="mt-2 space-y-2 text-base">
        {leg.steps.map((s, i) => (
          <li key={i} className="flex gap-3 border-t border-slateblue-100 pt-2 first:border-0 first:pt-0">
            <span className="figure w-6 shrink-0 text-right text-slateblue-500">{i + 1}</span>
            <span>{s.text}</span>
          </li>
        ))}
      </ol>
    </details>
  );
}

export default function DaySheet({ sheet, timeZone, units, canMark, skipReasons, renderedAt }: Props) {
  const [queue, setQueue] = useState<QueuedMark[]>([]);
  const [online, setOnline] = useState(true);
  const [problem, setProblem] = useState<string | null>(null);
  const [skipping, setSkipping] = useState<number | null>(null);
  const [reason, setReason] = useState('');
  const flushing = useRef(false);
  const stopIds = useMemo(() => new Set(sheet.stops.map((s) => s.id)), [sheet.stops]);

  // Marks from the server, overlaid with this phone's marks not yet confirmed.
  const [confirmedDay, setConfirmedDay] = useState<DayLogView | null>(sheet.dayLog);
  const isMine = useCallback((q: QueuedMark): q is QueuedDayMark => isDayMark(q) && q.date === sheet.date && q.farrierId === sheet.farrier.id, [sheet.date, sheet.farrier.id]);
  const [confirmed, setConfirmed] = useState<Map<number, StopMark & { skipReason: string | null }>>(() => {
    const m = new Map<number, StopMark & { skipReason: string | null }>();
    for (const s of sheet.stops) {
      if (s.visit) m.set(s.id, { state: s.visit.state, arrivedMs: s.visit.arrivedAt ? Date.parse(s.visit.arrivedAt) : null, departedMs: s.visit.departedAt ? Date.parse(s.visit.departedAt) : null, skipReason: s.visit.skipReason });
    }
    return m;
  });

  const marks = useMemo(() => {
    const m = new Map(confirmed);
    for (const q of [...queue].sort((a, b) => a.at.localeCompare(b.at))) {
      if (isDayMark(q) || !stopIds.has(q.stopId)) continue;
      const at = Date.parse(q.at);
      const prev = m.get(q.stopId);
      if (q.state === 'arrived') m.set(q.stopId, { state: 'arrived', arrivedMs: prev?.arrivedMs ?? at, departedMs: null, skipReason: null });
      else if (q.state === 'done') m.set(q.stopId, { state: 'done', arrivedMs: prev?.arrivedMs ?? at, departedMs: at, skipReason: null });
      else m.set(q.stopId, { state: 'skipped', arrivedMs: prev?.arrivedMs ?? null, departedMs: at, skipReason: q.skipReason ?? null });
    }
    return m;
  }, [confirmed, queue, stopIds]);

  const estimates = useMemo(
    () => reestimate(sheet.stops.map((s) => ({ id: s.id, arrivalMs: Date.parse(s.arrivalAt), startMs: Date.parse(s.startAt), departureMs: Date.parse(s.departureAt) })), marks),
    [sheet.stops, marks],
  );

  /** Reads the day log as the server holds it (after a refused day mark, or a first stop that started the day). */
  const refreshDay = useCallback(async () => {
    try {
      const response = await fetch(`/api/day-logs?date=${sheet.date}&farrier=${sheet.farrier.id}`, { headers: { accept: 'application/json' }, credentials: 'same-origin' });
      setOnline(true);
      if (response.ok) setConfirmedDay(((await response.json()) as { dayLogs: DayLogView[] }).dayLogs[0] ?? null);
    } catch {
      // offline (this may be the copy the phone kept): keep what we have
      setOnline(false);
    }
  }, [sheet.date, sheet.farrier.id]);

  const flush = useCallback(async () => {
    if (flushing.current) return;
    flushing.current = true;
    let dayTouched = false;
    let sent = 0;
    try {
      let list = readQueue();
      for (const mark of [...list]) {
        const outcome = await sendMark(mark);
        if (!outcome.ok && outcome.retry) {
          setOnline(false);
          break;
        }
        setOnline(true);
        sent++;
        list = readQueue().filter((m) => m.clientKey !== mark.clientKey);
        writeQueue(list);
        if (isDayMark(mark)) {
          dayTouched = true;
          if (outcome.ok) {
            const log = (outcome.body as { dayLog?: DayLogView } | null)?.dayLog;
            if (log && mark.date === sheet.date && mark.farrierId === sheet.farrier.id) setConfirmedDay(log);
          } else {
            setProblem(`${mark.kind === 'start' ? 'Start the day' : 'Back home'} was refused: ${outcome.message}`);
          }
          setQueue(list);
          continue;
        }
        dayTouched = true;
        if (outcome.ok) {
          setConfirmed((prev) => {
            const next = new Map(prev);
            const at = Date.parse(mark.at);
            const was = next.get(mark.stopId);
            if (mark.state === 'arrived') next.set(mark.stopId, { state: 'arrived', arrivedMs: was?.arrivedMs ?? at, departedMs: null, skipReason: null });
            else if (mark.state === 'done') next.set(mark.stopId, { state: 'done', arrivedMs: was?.arrivedMs ?? at, departedMs: at, skipReason: null });
            else next.set(mark.stopId, { state: 'skipped', arrivedMs: was?.arrivedMs ?? null, departedMs: at, skipReason: mark.skipReason ?? null });
            return next;
          });
        } else {
          setProblem(`A mark was refused: ${outcome.message}`);
        }
        setQueue(list);
      }
    } finally {
      flushing.current = false;
    }
    if (dayTouched) void refreshDay();
    // the copy kept for dead spots should show what the server now holds
    if (sent) void refreshKeptCopy();
  }, [refreshDay, sheet.date, sheet.farrier.id]);

  useEffect(() => {
    setQueue(readQueue());
    setOnline(navigator.onLine);
    void flush();
    // also tells a copy kept for a dead spot that it is offline, and brings its day marks up to date
    void refreshDay();
    const onOnline = () => {
      setOnline(true);
      void flush();
    };
    const onOffline = () => setOnline(false);
    window.addEventListener('online', onOnline);
    window.addEventListener('offline', onOffline);
    const timer = setInterval(() => void flush(), 20_000);
    return () => {
      window.removeEventListener('online', onOnline);
      window.removeEventListener('offline', onOffline);
      clearInterval(timer);
    };
  }, [flush, refreshDay]);

  const markDay = (kind: 'start' | 'end', odometer: number | null) => {
    const entry: QueuedDayMark = { clientKey: newClientKey(), kind, date: sheet.date, farrierId: sheet.farrier.id, at: new Date().toISOString(), odometer };
    const list = [...readQueue(), entry];
    writeQueue(list);
    setQueue(list);
    setProblem(null);
    void flush();
  };

  const mark = (stopId: number, state: MarkState, skipReason?: string) => {
    const entry: QueuedStopMark = { clientKey: newClientKey(), stopId, state, at: new Date().toISOString(), skipReason: skipReason ?? null };
    const list = [...readQueue(), entry];
    writeQueue(list);
    setQueue(list);
    setProblem(null);
    void flush();
  };

  const horses = sheet.stops.reduce((n, s) => n + s.horses.length, 0);
  const doneCount = sheet.stops.filter((s) => marks.get(s.id)?.state === 'done').length;
  const nextStop = sheet.stops.find((s) => !marks.has(s.id) || marks.get(s.id)?.state === 'arrived');
  const waiting = queue.filter((q) => (isDayMark(q) ? isMine(q) : stopIds.has(q.stopId))).length;
  const dayQueued = queue.filter(isMine);

  return (
    <div className="day-sheet mx-auto max-w-xl text-lg">
      <section className="card p-4" aria-label="Day totals">
        <div className="grid grid-cols-3 gap-3 text-center">
          <div><p className="figure text-2xl font-semibold">{sheet.stops.length}</p><p className="text-sm text-slateblue-600">stops</p></div>
          <div><p className="figure text-2xl font-semibold">{horses}</p><p className="text-sm text-slateblue-600">horses</p></div>
          <div><p className="figure text-2xl font-semibold">{distance(sheet.route.distanceM, units)}</p><p className="text-sm text-slateblue-600">driving</p></div>
        </div>
        <p className="mt-3 text-center text-base text-slateblue-700">
          Leave <span className="figure font-semibold">{clock(sheet.route.startAt, timeZone)}</span> · home <span className="figure font-semibold">{clock(sheet.route.endAt, timeZone)}</span> ·{' '}
          <span className="figure">{duration(sheet.route.driveSeconds)}</span> at the wheel
          {sheet.route.breakStartAt && <> · break <span className="figure">{clock(sheet.route.breakStartAt, timeZone)}</span></>}
        </p>
        {sheet.route.overtimeSeconds > 0 && <p className="caution mt-2 text-base">Planned overtime <span className="figure">{duration(sheet.route.overtimeSeconds)}</span>: take your break and watch for tiredness on the drive home.</p>}
      </section>

      <DayMarks
        confirmed={confirmedDay}
        queued={dayQueued}
        anyStopMarked={marks.size > 0}
        firstStopPosition={sheet.stops[0]?.position ?? 1}
        plannedStartAt={sheet.route.startAt}
        plannedEndAt={sheet.route.endAt}
        plannedDistanceM={sheet.route.distanceM}
        timeZone={timeZone}
        units={units}
        canMark={canMark}
        onMark={markDay}
      />

      {canMark && (
        <p role="status" data-testid="sync-status" className={`no-print mt-3 rounded-lg px-3 py-2 text-base font-semibold ${waiting ? 'bg-hay-200 text-slateblue-900' : 'bg-white text-slateblue-700'}`}>
          {waiting
            ? `${online ? 'Sending' : 'No signal'}: ${waiting} mark${waiting === 1 ? '' : 's'} waiting, sent when you are back in range`
            : `${doneCount} of ${sheet.stops.length} stops done · all marks sent`}
        </p>
      )}
      {!online && (
        <p data-testid="offline-copy" className="no-print mt-2 rounded-lg bg-slateblue-100 px-3 py-2 text-base text-slateblue-800">
          {waiting ? 'Showing' : 'No signal: showing'} the sheet as loaded <span className="figure font-semibold">{loadedAt(renderedAt, timeZone)}</span>. Marks you make are kept on this phone.
        </p>
      )}
      {problem && <p role="alert" className="no-print mt-2 rounded-lg bg-ember-100 px-3 py-2 text-base text-ember-900">{problem}</p>}

      <ol className="mt-4 space-y-4">
        {sheet.stops.map((stop, i) => {
          const m = marks.get(stop.id);
          const est = estimates[i]!;
          const late = Math.round(est.delaySec / 60);
          const cautions = cautionsOf(stop);
          const minutes = stop.horses.reduce((n, h) => n + h.minutes, 0);
          return (
            <li key={stop.id} className={`stop card overflow-hidden ${m?.state === 'done' ? 'opacity-80' : ''}`} data-stop-id={stop.id} data-state={m?.state ?? 'ahead'}>
              <div className={`flex items-start gap-3 px-4 pt-4`}>
                <span className={`figure flex h-10 w-10 shrink-0 items-center justify-center rounded-full text-xl font-bold text-white ${m?.state === 'done' ? 'bg-[#2f7d4f]' : m?.state === 'skipped' ? 'bg-slateblue-400' : m?.state === 'arrived' ? 'bg-hay-500' : 'bg-ember-600'}`}>{stop.position}</span>
                <div className="min-w-0 flex-1">
                  <h2 className="text-xl font-bold leading-tight">{stop.barn.name}</h2>
                  <p className="text-base text-slateblue-700">{stop.barn.address}</p>
                </div>
              </div>
              <div className="px-4 pb-4">
                <p className="mt-3 text-base">
                  {stop.windowStartAt && stop.windowEndAt && (
                    <>Owner told <span className="figure font-semibold">{clock(stop.windowStartAt, timeZone)}–{clock(stop.windowEndAt, timeZone)}</span> · </>
                  )}
                  planned <span className="figure font-semibold">{clock(stop.arrivalAt, timeZone)}</span> · <span className="figure">{minutes} min</span> work
                </p>
                {m?.state === 'done' && <p className="mt-1 text-base font-semibold text-[#2f7d4f]">Done {m.departedMs ? <span className="figure">{clock(m.departedMs, timeZone)}</span> : null}</p>}
                {m?.state === 'arrived' && <p className="mt-1 text-base font-semibold text-hay-500">Arrived <span className="figure">{m.arrivedMs ? clock(m.arrivedMs, timeZone) : ''}</span></p>}
                {m?.state === 'skipped' && <p className="mt-1 text-base font-semibold text-slateblue-600">Skipped: {m.skipReason}</p>}
                {!m && est.basis === 'estimate' && Math.abs(late) >= 5 && Math.abs(late) < 720 && (
                  <p className="mt-1 text-base font-semibold text-ember-800" data-testid="expected">
                    Now expected <span className="figure">{clock(est.arrivalMs, timeZone)}</span> ({late > 0 ? `${late} min late` : `${-late} min early`})
                  </p>
                )}

                {stop.barn.notes && <p className="mt-3 rounded-lg border border-slateblue-200 px-3 py-2 text-base"><span className="font-semibold">Access: </span>{stop.barn.notes}</p>}

                {stop.owners.length > 0 && (
                  <ul className="mt-3 space-y-2">
                    {stop.owners.map((o) => (
                      <li key={o.id} className="flex items-center justify-between gap-2">
                        <span className="font-semibold">{o.name}</span>
                        {o.phone && (
                          <a className="btn-quiet min-h-12 text-base" href={`tel:${o.phone}`} aria-label={`Call ${o.name}`}>
                            Call <span className="figure">{o.phone.replace(/^\+1(\d{3})(\d{3})(\d{4})$/, '($1) $2-$3')}</span>
                          </a>
                        )}
                      </li>
                    ))}
                  </ul>
                )}

                <ul className="mt-3 divide-y divide-slateblue-100 rounded-lg border border-slateblue-100">
                  {stop.horses.map((h) => (
                    <li key={h.jobId} className="px-3 py-2">
                      <div className="flex items-baseline justify-between gap-2">
                        <span className="text-lg font-bold">{h.name}</span>
                        <span className="figure text-base text-slateblue-600">{h.minutes} min</span>
                      </div>
                      <p className="text-base">{h.work.map((w) => w.name).join(' + ') || 'Visit'}</p>
                      <p className="text-sm text-slateblue-700">
                        {[h.shoeSize ? `Shoe size ${h.shoeSize}` : null, h.needsSecondPerson ? 'Needs a second person' : null, h.lame ? 'Lame' : null, stop.owners.length > 1 ? h.ownerName : null].filter(Boolean).join(' · ')}
                      </p>
                      {(h.notes || h.jobNotes) && <p className="mt-1 text-base italic">{[h.jobNotes, h.notes].filter(Boolean).join(' — ')}</p>}
                    </li>
                  ))}
                </ul>

                {cautions.length > 0 && (
                  <ul className="mt-3 space-y-1">
                    {cautions.map((c) => (
                      <li key={c.key} className="caution text-base" data-caution={c.key}>{c.text}</li>
                    ))}
                  </ul>
                )}

                <Directions leg={stop.leg} units={units} label={i === 0 ? 'From home' : `From stop ${i}`} open={stop.id === nextStop?.id} />

                {canMark && (
                  <div className="no-print mt-4">
                    {skipping === stop.id ? (
                      <form
                        className="space-y-2"
                        onSubmit={(e) => {
                          e.preventDefault();
                          if (!reason.trim()) return;
                          mark(stop.id, 'skipped', reason.trim());
                          setSkipping(null);
                          setReason('');
                        }}
                      >
                        <label className="label" htmlFor={`reason-${stop.id}`}>Why is this stop skipped?</label>
                        <select id={`reason-${stop.id}`} className="field min-h-12 text-base" value={skipReasons.includes(reason) ? reason : ''} onChange={(e) => setReason(e.target.value)}>
                          <option value="">Pick a reason or write one below</option>
                          {skipReasons.map((r) => <option key={r} value={r}>{r}</option>)}
                        </select>
                        <input className="field min-h-12 text-base" placeholder="Or in your words" value={reason} onChange={(e) => setReason(e.target.value)} maxLength={255} />
                        <div className="grid grid-cols-2 gap-2">
                          <button type="button" className="btn-quiet min-h-14 text-lg" onClick={() => setSkipping(null)}>Back</button>
                          <button type="submit" className="btn-primary min-h-14 text-lg" disabled={!reason.trim()}>Skip stop</button>
                        </div>
                      </form>
                    ) : (
                      <div className="grid grid-cols-3 gap-2">
                        <button type="button" className="btn-quiet min-h-14 text-lg" disabled={!!m && m.state !== 'skipped'} onClick={() => mark(stop.id, 'arrived')}>Arrived</button>
                        <button type="button" className="btn-primary min-h-14 text-lg" disabled={m?.state === 'done'} onClick={() => mark(stop.id, 'done')}>Done</button>
                        <button type="button" className="btn-quiet min-h-14 text-lg" disabled={m?.state === 'done' || m?.state === 'skipped'} onClick={() => { setSkipping(stop.id); setReason(''); }}>Skip…</button>
                      </div>
                    )}
                  </div>
                )}
              </div>
            </li>
          );
        })}
      </ol>

      <section className="card mt-4 p-4" aria-label="Drive home">
        <h2 className="text-xl font-bold">Home</h2>
        <p className="text-base text-slateblue-700">{sheet.farrier.homeAddress} · planned <span className="figure font-semibold">{clock(sheet.route.endAt, timeZone)}</span></p>
        <Directions leg={sheet.homeLeg} units={units} label="From the last stop" open={false} />
      </section>
    </div>
  );
}
