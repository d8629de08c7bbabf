/**
 * The dispatcher's screen: date, "Plan the day" with live progress, the map of the day's routes and the
 * board. Reads and writes through the plans API with react-query; a 409 (someone else edited) reloads
 * the plan and says so, rather than overwriting their work.
 */
import { lazy, memo, Suspense, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import QueryRoot from '../QueryRoot.tsx';
import { api, ApiError } from '../../lib/client/api.ts';
import type { Move, PlanProgressView, PlanView } from '../../schemas/plans.ts';
import type { MapBarn, MapHome } from '../map/map-layers.ts';
import { previewMoves } from '../../lib/dispatch/preview.ts';
import { unitLabel } from '../../lib/review/mileage.ts';
import Board from './Board.tsx';

// Memoised: the screen re-renders as drags start and end and as requests come and go; the map should
// only when what it shows changes.
const MapView = memo(lazy(() => import('../map/MapView.tsx')));
const noFarriers: ReadonlySet<number> = new Set();

export interface DispatchScreenProps {
  initialDate: string;
  today: string;
  barns: MapBarn[];
  homes: (MapHome & { workingDays: number[] })[];
  units: 'miles' | 'km';
  initialPlan: PlanView | null;
}

const addDays = (d: string, n: number) => {
  const x = new Date(`${d}T12:00:00Z`);
  x.setUTCDate(x.getUTCDate() + n);
  return x.toISOString().slice(0, 10);
};
const isoWeekday = (d: string) => new Date(`${d}T12:00:00Z`).getUTCDay() || 7;
const dayLabel = (d: string) => new Date(`${d}T12:00:00Z`).toLocaleDateString('en-US', { weekday: 'long', day: 'numeric', month: 'long', timeZone: 'UTC' });

export default function DispatchScreen(props: DispatchScreenProps) {
  return (
    <QueryRoot>
      <Screen {...props} />
    </QueryRoot>
  );
}

function Screen({ initialDate, today, barns, homes, units, initialPlan }: DispatchScreenProps) {
  const qc = useQueryClient();
  const [date, setDate] = useState(initialDate);
  const [selectedBarnId, setSelectedBarnId] = useState<number | null>(null);
  const [notice, setNotice] = useState<{ tone: 'error' | 'info'; text: string } | null>(null);
  const [mounted, setMounted] = useState(false);
  useEffect(() => setMounted(true), []);
  useEffect(() => {
    const url = new URL(window.location.href);
    url.searchParams.set('date', date);
    window.history.replaceState(null, '', url);
  }, [date]);

  const planKey = ['plan', date];
  const plan = useQuery<PlanView | null>({
    queryKey: planKey,
    queryFn: async () => {
      try {
        return await api<PlanView>(`/api/plans?date=${date}`);
      } catch (e) {
        if (e instanceof ApiError && e.status === 404) return null;
        throw e;
      }
    },
    initialData: date === initialDate ? initialPlan : undefined,
    // A published day is being worked: pick up the farriers' marks from their day sheets.
    refetchInterval: (q) => (q.state.data?.state === 'published' ? 30_000 : false),
  });
  const view = plan.data ?? null;

  const lines = useQuery({
    queryKey: ['plan-lines', view?.id, view?.version],
    queryFn: () => api<{ version: number; lines: { farrierId: number; colour: string; coordinates: [number, number][] }[] }>(`/api/plans/${view!.id}/lines`),
    enabled: !!view,
    staleTime: Infinity,
    placeholderData: (prev) => prev,
  });

  const setPlan = (p: PlanView) => qc.setQueryData(planKey, p);
  const onError = (e: unknown) => {
    if (e instanceof ApiError && e.status === 409) {
      setNotice({ tone: 'error', text: `${e.message}. The board now shows the latest plan.` });
      void qc.invalidateQueries({ queryKey: planKey });
    } else setNotice({ tone: 'error', text: e instanceof Error ? e.message : 'Something went wrong' });
  };

  const planDay = useMutation({
    mutationFn: () => (view ? api<PlanView>(`/api/plans/${view.id}/replan`, { method: 'POST', body: { version: view.version } }) : api<PlanView>('/api/plans', { method: 'POST', body: { date } })),
    onMutate: () => setNotice(null),
    onSuccess: (p) => {
      setPlan(p);
      setNotice({ tone: 'info', text: `Planned ${p.figures.horses} horses in ${p.figures.stops} stops (${p.figures.solveSeconds ?? '–'} s, ${p.figures.iterations ?? '–'} search rounds).` });
    },
    onError,
  });
  // A drop shows at once: the moves are applied to the shown plan (the same list operations the server
  // runs) while the server re-times; its answer replaces the preview, and a refusal (409 or any error)
  // puts the previous plan back before the latest is loaded.
  const [retiming, setRetiming] = useState<ReadonlySet<number>>(noFarriers);
  const move = useMutation({
    mutationFn: ({ plan: p, moves }: { plan: PlanView; moves: Move[] }) => api<PlanView>(`/api/plans/${p.id}`, { method: 'PATCH', body: { version: p.version, moves } }),
    onMutate: async ({ plan: p, moves }) => {
      setNotice(null);
      await qc.cancelQueries({ queryKey: planKey });
      const preview = previewMoves(p, moves);
      if (preview) {
        qc.setQueryData(planKey, preview.plan);
        setRetiming(new Set(preview.touched));
      }
      return { before: p, shown: preview?.plan ?? p };
    },
    onSuccess: setPlan,
    onError: (e, _vars, context) => {
      // Put the previous plan back unless something newer has replaced the preview meanwhile.
      if (context && qc.getQueryData(planKey) === context.shown) qc.setQueryData(planKey, context.before);
      onError(e);
    },
    onSettled: () => setRetiming(noFarriers),
  });
  const publish = useMutation({
    mutationFn: () => api<PlanView>(`/api/plans/${view!.id}/publish`, { method: 'POST', body: { version: view!.version } }),
    onSuccess: (p) => {
      setPlan(p);
      setNotice({ tone: 'info', text: 'Published: jobs are booked and owners’ arrival-window texts are queued.' });
    },
    onError,
  });
  const discard = useMutation({
    mutationFn: () => api<void>(`/api/plans/${view!.id}`, { method: 'DELETE' }),
    onSuccess: () => qc.setQueryData(planKey, null),
    onError,
  });

  const progress = useQuery({
    queryKey: ['plan-progress', date],
    queryFn: () => api<PlanProgressView>(`/api/plans/progress?date=${date}`),
    enabled: planDay.isPending,
    refetchInterval: 250,
  });

  // `mutate` keeps its identity across renders (the mutation object does not), so the board's memoised
  // lanes and cards are not re-rendered just because a request started or ended.
  const moveMutate = move.mutate;
  const viewRef = useRef(view);
  viewRef.current = view;
  const onMoves = useCallback((moves: Move[]) => {
    if (viewRef.current) moveMutate({ plan: viewRef.current, moves });
  }, [moveMutate]);
  const busy = planDay.isPending || move.isPending || publish.isPending;
  // The board dims as a whole only when it cannot show the edit itself (work taken off the plan).
  const boardBusy = planDay.isPending || publish.isPending || (move.isPending && retiming.size === 0);

  // The map's sources change only when what they show changes, not with every re-timed plan: a new
  // array would send the barns or homes to maplibre's worker again and redraw the map after each drop.
  const laneKey = view ? view.routes.map((r) => r.farrierId).join(',') : null;
  const workingHomes = useMemo(() => {
    const ids = laneKey === null ? null : new Set(laneKey.split(',').filter(Boolean).map(Number));
    return homes.filter((h) => (ids ? ids.has(Number(h.id)) : h.workingDays.includes(isoWeekday(date))));
  }, [homes, laneKey, date]);
  const mapRoutes = useMemo(() => (lines.data?.lines ?? []).map((l) => ({ farrierId: l.farrierId, colour: l.colour, coordinates: l.coordinates })), [lines.data]);
  // New route lines wait while a card is being dragged and then for an idle moment of the browser:
  // handing changed lines to maplibre serialises their points for its worker on the main thread, which
  // would stall a drag (or a key press) when the lines of the previous edit arrive in the middle of it.
  const [dragging, setDragging] = useState(false);
  const [shownRoutes, setShownRoutes] = useState(mapRoutes);
  useEffect(() => {
    if (dragging || shownRoutes === mapRoutes) return;
    if (typeof window.requestIdleCallback === 'function') {
      const handle = window.requestIdleCallback(() => setShownRoutes(mapRoutes), { timeout: 1000 });
      return () => window.cancelIdleCallback(handle);
    }
    const handle = window.setTimeout(() => setShownRoutes(mapRoutes), 50);
    return () => window.clearTimeout(handle);
  }, [dragging, mapRoutes, shownRoutes]);
  // Barns on the day's routes show as booked once published; the rest keep their due state.
  const bookedKey = view?.state === 'published' ? [...new Set(view.routes.flatMap((r) => r.stops.map((s) => s.barnId)))].sort((a, b) => a - b).join(',') : '';
  const mapBarns = useMemo(() => {
    if (!bookedKey) return barns;
    const booked = new Set(bookedKey.split(',').map(Number));
    return barns.map((b) => (booked.has(Number(b.id)) ? { ...b, dueState: 'booked' as const } : b));
  }, [barns, bookedKey]);

  const onBarnClick = useCallback((b: MapBarn) => {
    const id = Number(b.id);
    setSelectedBarnId(id);
    // A lane mounts only the cards near its view and scrolls the selected barn's stop in on the next
    // render; the page follows to that card once it is there (two frames: render, then the lane's scroll).
    requestAnimationFrame(() => requestAnimationFrame(() => {
      document.querySelector(`[data-barn="${id}"]`)?.scrollIntoView({ block: 'nearest', inline: 'nearest', behavior: 'smooth' });
    }));
  }, []);

  const p = progress.data;
  const pct = p && p.budgetSeconds > 0 ? Math.min(100, Math.round((p.seconds / p.budgetSeconds) * 100)) : 0;

  return (
    <div className="max-w-[calc(100vw-2rem)] space-y-4 md:max-w-[calc(100vw-18rem)]">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1>Dispatch</h1>
          <p className="text-sm text-slateblue-600">{dayLabel(date)}{date === addDays(today, 1) ? ' (tomorrow)' : date === today ? ' (today)' : ''}</p>
        </div>
        <div className="flex flex-wrap items-center gap-2">
          <button type="button" className="btn-quiet px-2" aria-label="Previous day" onClick={() => setDate(addDays(date, -1))} disabled={busy}>←</button>
          <label className="sr-only" htmlFor="plan-date">Plan date</label>
          <input id="plan-date" type="date" className="field w-40 figure" value={date} onChange={(e) => e.target.value && setDate(e.target.value)} disabled={busy} />
          <button type="button" className="btn-quiet px-2" aria-label="Next day" onClick={() => setDate(addDays(date, 1))} disabled={busy}>→</button>
          {view && (
            <span className={`rounded-full px-3 py-1 text-xs font-semibold ${view.state === 'published' ? 'bg-green-100 text-green-800' : 'bg-hay-200 text-slateblue-800'}`} data-testid="plan-state">
              {view.state === 'published' ? 'Published' : 'Draft'} · <span className="figure">v{view.version}</span>
            </span>
          )}
          <button type="button" className={view ? 'btn-quiet' : 'btn-primary'} onClick={() => planDay.mutate()} disabled={busy || plan.isLoading} data-testid="plan-button">
            {view ? 'Re-plan the rest' : 'Plan the day'}
          </button>
          {view?.state === 'draft' && (
            <>
              <button type="button" className="btn-quiet" onClick={() => confirm('Discard this draft? Its jobs go back to the due list.') && discard.mutate()} disabled={busy}>Discard draft</button>
              <button type="button" className="btn-primary" onClick={() => publish.mutate()} disabled={busy || view.figures.stops === 0} data-testid="publish-button">Publish</button>
            </>
          )}
        </div>
      </div>

      {planDay.isPending && (
        <div className="card p-3" role="status" aria-live="polite" data-testid="plan-progress">
          <div className="flex justify-between text-sm">
            <span>Planning {dayLabel(date)}… {p?.phase === 'matrix' ? 'measuring drive times' : p?.phase === 'saving' ? 'saving the plan' : 'searching for the best routes'}</span>
            <span className="figure text-slateblue-600">{p ? `${p.seconds.toFixed(1)} / ${p.budgetSeconds} s · ${p.iterations} rounds · ${p.unplanned} left out` : 'starting'}</span>
          </div>
          <div className="mt-2 h-2 overflow-hidden rounded bg-slateblue-100"><div className="h-full bg-ember-500 transition-all" style={{ width: `${pct}%` }} /></div>
        </div>
      )}
      {notice && (
        <p className={`rounded-lg px-3 py-2 text-sm ${notice.tone === 'error' ? 'bg-ember-50 text-ember-800' : 'bg-slateblue-50 text-slateblue-800'}`} role={notice.tone === 'error' ? 'alert' : 'status'} data-testid="notice">{notice.text}</p>
      )}
      {plan.isError && <p className="rounded-lg bg-ember-50 px-3 py-2 text-sm text-ember-800" role="alert">Could not load the plan: {(plan.error as Error).message}</p>}

      {view && (
        <dl className="flex flex-wrap gap-x-6 gap-y-1 text-sm" data-testid="plan-figures">
          <Figure label="Horses" value={String(view.figures.horses)} />
          <Figure label="Stops" value={String(view.figures.stops)} />
          <Figure label="Driving" value={`${Math.floor(view.figures.driveMinutes / 60)} h ${String(view.figures.driveMinutes % 60).padStart(2, '0')}`} />
          <Figure label="Distance" value={`${view.figures.distance.toFixed(1)} ${unitLabel(units)}`} />
          <Figure label="Overtime" value={`${view.figures.overtimeMinutes} min`} />
          <Figure label="Unplanned" value={String(view.unplanned.length)} />
          {move.data?.retimeMs !== undefined && <Figure label="Last re-time" value={`${move.data.retimeMs} ms`} />}
        </dl>
      )}

      <div className="h-[360px]">
        {mounted && (
          <Suspense fallback={<div className="h-full rounded-lg border border-slateblue-200 bg-slateblue-50" />}>
            <MapView barns={mapBarns} homes={workingHomes} routes={shownRoutes} selectedBarnId={selectedBarnId} onBarnClick={onBarnClick} fitTo={shownRoutes.length ? 'routes' : 'all'} units={units} height="360px" />
          </Suspense>
        )}
      </div>

      {view ? (
        <Board routes={view.routes} unplanned={view.unplanned} units={units} selectedBarnId={selectedBarnId} onSelectBarn={setSelectedBarnId} onMoves={onMoves} busy={boardBusy} retiming={retiming} onDragging={setDragging} />
      ) : plan.isLoading ? (
        <p className="text-sm text-slateblue-600">Loading the plan…</p>
      ) : (
        <div className="card p-4 text-sm" data-testid="no-plan">
          <p className="font-semibold">No plan for {dayLabel(date)} yet.</p>
          <p className="mt-1 text-slateblue-600">
            {workingHomes.length} {workingHomes.length === 1 ? 'farrier works' : 'farriers work'} that day. “Plan the day” takes the horses due or overdue within the planning horizon,
            the barns’ hours, owners’ windows and pins, and proposes everyone’s routes in about 5 seconds. Nothing is sent to owners until you publish.
          </p>
        </div>
      )}
      <p className="caution text-xs">
        Plans are proposals. Hot fitting, difficult horses and therapeutic work carry risk: the farrier on site decides, with the horse’s vet where the work calls for it. Watch driving hours and fatigue.
      </p>
    </div>
  );
}

function Figure({ label, value }: { label: string; value: string }) {
  return (
    <div className="flex items-baseline gap-1.5">
      <dt className="text-xs uppercase tracking-wide text-slateblue-500">{label}</dt>
      <dd className="figure font-medium">{value}</dd>
    </div>
  );
}
