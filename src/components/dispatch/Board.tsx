/**
 * The dispatch board: one lane per farrier plus the unplanned lane. Stops (and single jobs) are dragged
 * with dnd-kit, by mouse or keyboard (focus a card, Space to lift, arrow keys to move, Space to drop).
 * A drop becomes moves for the plans API; the server re-times and answers, nothing moves on its own.
 */
import { memo, useCallback, useEffect, useMemo, useRef, useState, type ReactNode, type RefObject } from 'react';
import {
  DndContext, DragOverlay, KeyboardSensor, PointerSensor, closestCenter, useDroppable, useSensor, useSensors,
  type Collision, type CollisionDetection, type DragEndEvent, type DragStartEvent,
} from '@dnd-kit/core';
import { SortableContext, sortableKeyboardCoordinates, useSortable, verticalListSortingStrategy } from '@dnd-kit/sortable';
import { CSS } from '@dnd-kit/utilities';
import { defaultRangeExtractor, useVirtualizer, type Range, type VirtualItem } from '@tanstack/react-virtual';
import type { Move, PlanJobView, PlanRouteView, PlanStopView, UnplannedView } from '../../schemas/plans.ts';

const clock = (iso: string) => iso.slice(11, 16);
const hm = (minutes: number) => (minutes < 60 ? `${minutes} min` : `${Math.floor(minutes / 60)} h ${String(minutes % 60).padStart(2, '0')}`);
const unitWord = (units: 'miles' | 'km') => (units === 'miles' ? 'mi' : 'km');

export interface BoardProps {
  routes: PlanRouteView[];
  unplanned: UnplannedView[];
  units: 'miles' | 'km';
  selectedBarnId: number | null;
  onSelectBarn: (barnId: number | null) => void;
  onMoves: (moves: Move[]) => void;
  busy: boolean;
  /** Farriers whose lanes show a drop ahead of the server's re-timed answer. */
  retiming?: ReadonlySet<number>;
  /** Told when a drag starts and when it ends (dropped or cancelled). */
  onDragging?: (dragging: boolean) => void;
}

type DragItem = { kind: 'stop'; stop: PlanStopView; farrierId: number } | { kind: 'job'; job: PlanJobView; barnName: string; farrierId: number | null };

/** Moves for dropping a whole stop: its jobs taken off first, then placed, so positions stay exact. */
function stopMoves(stop: PlanStopView, toFarrierId: number | null, position?: number): Move[] {
  const ids = stop.jobs.map((j) => j.id);
  if (toFarrierId === null) return ids.map((jobId) => ({ jobId, toFarrierId: null }));
  return [
    ...ids.map((jobId) => ({ jobId, toFarrierId: null })),
    ...ids.map((jobId) => (position === undefined ? { jobId, toFarrierId } : { jobId, toFarrierId, position })),
  ];
}

/**
 * Where a dragged card is over, found in two steps: first the lane under the card's centre (the lane
 * whose left–right span holds it, else the nearest lane sideways), then the closest centre among that
 * lane and its own cards. dnd-kit's closestCenter over every card would read all 300 card rectangles
 * on each pointer move (each read re-checks the scroll offsets, forcing layout); this reads the few
 * lanes and one lane's cards. While the target stays the same the same array is answered: dnd-kit
 * hands the collisions to every card through its context, and a fresh array on every pointer move
 * would re-render all cards at pointer rate, while only a change of target needs to.
 */
function useLaneCollisions(): CollisionDetection {
  const last = useRef<Collision[]>([]);
  return useCallback((args) => {
    const { collisionRect, droppableRects, droppableContainers } = args;
    const x = collisionRect.left + collisionRect.width / 2;
    let lane: string | null = null;
    let best = Infinity;
    for (const c of droppableContainers) {
      const id = String(c.id);
      if (!id.startsWith('lane:')) continue;
      const r = droppableRects.get(c.id);
      if (!r) continue;
      const left = r.left, right = left + r.width;
      const gap = x < left ? left - x : x > right ? x - right : 0;
      if (gap < best) {
        best = gap;
        lane = id;
      }
    }
    const candidates = lane === null
      ? droppableContainers
      : droppableContainers.filter((c) => String(c.id) === lane || (c.data.current as { sortable?: { containerId?: unknown } } | undefined)?.sortable?.containerId === lane);
    const next = closestCenter({ ...args, droppableContainers: candidates });
    const prev = last.current;
    if (next.length === prev.length && next[0]?.id === prev[0]?.id) return prev;
    last.current = next;
    return next;
  }, []);
}

export default memo(function Board({ routes, unplanned, units, selectedBarnId, onSelectBarn, onMoves, busy, retiming, onDragging }: BoardProps) {
  const collisionDetection = useLaneCollisions();
  const sensors = useSensors(
    useSensor(PointerSensor, { activationConstraint: { distance: 6 } }),
    useSensor(KeyboardSensor, { coordinateGetter: sortableKeyboardCoordinates }),
  );
  const [active, setActive] = useState<DragItem | null>(null);
  const [watch] = useState(() => new DragWatch());
  // The first job of the last drop: the lane that holds it once the plan answers scrolls to it.
  const [revealJobId, setRevealJobId] = useState<number | null>(null);
  useEffect(() => setRevealJobId(null), [routes]);

  const index = useMemo(() => {
    const stops = new Map<string, { stop: PlanStopView; farrierId: number; index: number }>();
    const jobs = new Map<string, DragItem>();
    for (const r of routes) {
      r.stops.forEach((s, i) => {
        stops.set(`stop:${s.id}`, { stop: s, farrierId: r.farrierId, index: i });
        for (const j of s.jobs) jobs.set(`job:${j.id}`, { kind: 'job', job: j, barnName: s.barnName, farrierId: r.farrierId });
      });
    }
    for (const u of unplanned) jobs.set(`job:${u.jobId}`, { kind: 'job', job: u.job, barnName: u.barnName, farrierId: null });
    return { stops, jobs };
  }, [routes, unplanned]);

  const itemOf = (id: string): DragItem | null => {
    const s = index.stops.get(id);
    if (s) return { kind: 'stop', stop: s.stop, farrierId: s.farrierId };
    return index.jobs.get(id) ?? null;
  };

  const onDragStart = (e: DragStartEvent) => {
    watch.set(true);
    setActive(itemOf(String(e.active.id)));
    onDragging?.(true);
  };
  const onDragCancel = () => {
    watch.set(false);
    setActive(null);
    onDragging?.(false);
  };
  const onDragEnd = (e: DragEndEvent) => {
    watch.set(false);
    setActive(null);
    onDragging?.(false);
    const item = itemOf(String(e.active.id));
    const overId = e.over ? String(e.over.id) : null;
    if (!item || !overId || overId === String(e.active.id)) return;
    // Where it landed: a lane (append), a stop card (in front of it, or its place when reordering), or the unplanned lane.
    let toFarrierId: number | null;
    let position: number | undefined;
    if (overId === 'lane:unplanned' || (overId.startsWith('job:') && index.jobs.get(overId)?.farrierId === null)) toFarrierId = null;
    else if (overId.startsWith('lane:')) toFarrierId = Number(overId.slice(5));
    else if (overId.startsWith('stop:')) {
      const target = index.stops.get(overId)!;
      toFarrierId = target.farrierId;
      position = target.index + 1;
    } else return;
    if (toFarrierId === item.farrierId && position === undefined) return;
    const moves = item.kind === 'stop' ? stopMoves(item.stop, toFarrierId, position) : [position === undefined ? { jobId: item.job.id, toFarrierId } : { jobId: item.job.id, toFarrierId, position }];
    setRevealJobId(moves[0]?.jobId ?? null);
    onMoves(moves);
  };

  return (
    <DndContext sensors={sensors} collisionDetection={collisionDetection} onDragStart={onDragStart} onDragEnd={onDragEnd} onDragCancel={onDragCancel}>
      <div className={`flex gap-3 overflow-x-auto pb-3 ${busy ? 'opacity-70' : ''}`} data-testid="board">
        {routes.map((r) => (
          <Lane
            key={r.farrierId}
            route={r}
            units={units}
            selectedBarnId={selectedBarnId}
            activeStopId={active?.kind === 'stop' && active.farrierId === r.farrierId ? active.stop.id : null}
            revealJobId={revealJobId}
            retiming={retiming?.has(r.farrierId) ?? false}
            watch={watch}
            onSelectBarn={onSelectBarn}
            onMoves={onMoves}
          />
        ))}
        <UnplannedLane items={unplanned} selectedBarnId={selectedBarnId} onSelectBarn={onSelectBarn} />
      </div>
      <DragOverlay dropAnimation={null}>
        {active?.kind === 'stop' ? (
          <div className="w-64 rounded-lg border-2 border-ember-400 bg-white p-2 text-sm shadow-lg">
            <span className="figure">{clock(active.stop.arrival)}</span> {active.stop.barnName} · {active.stop.jobs.length} {active.stop.jobs.length === 1 ? 'horse' : 'horses'}
          </div>
        ) : active?.kind === 'job' ? (
          <div className="w-60 rounded-md border-2 border-ember-400 bg-white px-2 py-1 text-sm shadow-lg">{active.job.horseName} · {active.barnName}</div>
        ) : null}
      </DragOverlay>
    </DndContext>
  );
});

/** A card's height before it is measured (a one-horse stop without warnings), and the space between cards. */
const CARD_ESTIMATE_PX = 136;
const CARD_GAP_PX = 8;
const LANE_PADDING_PX = 8;

/**
 * The part of the browser window a lane's scroll box shows, in window pixels (`top` may be negative
 * when the page is scrolled past the lane's top). Lanes follow the window's scrolling with this so that
 * they mount only the cards a dispatcher can see.
 */
type WindowSpan = { top: number; bottom: number };

/** The window span of an element, rounded to whole pixels so equal spans compare equal. */
function windowSpanOf(el: HTMLElement): WindowSpan {
  const r = el.getBoundingClientRect();
  return { top: Math.round(r.top), bottom: Math.round(r.bottom) };
}

/**
 * Whether a drag is under way, shared by the board with its lanes without re-rendering them: lanes
 * keep the cards they have mounted while a card is dragged (mounting and unmounting cards mid-drag makes
 * dnd-kit measure every card again) and catch up with the window once the drag has ended.
 */
class DragWatch {
  dragging = false;
  private readonly ended = new Set<() => void>();
  /** Calls `fn` whenever a drag ends (dropped or cancelled); returns the unsubscribe function. */
  onEnd(fn: () => void): () => void {
    this.ended.add(fn);
    return () => this.ended.delete(fn);
  }
  set(dragging: boolean) {
    this.dragging = dragging;
    if (!dragging) for (const fn of this.ended) fn();
  }
}

/**
 * The element's place in the browser window, kept up to date after mount, on window scroll and resize
 * (once per frame), and when the element or the page changes size (content above the board, such as
 * a notice, moves it); held while a card is dragged. Setting the same span again is ignored, so
 * nothing re-renders.
 */
function useWindowSpan(ref: RefObject<HTMLElement | null>, watch: DragWatch): WindowSpan | null {
  const [span, setSpan] = useState<WindowSpan | null>(null);
  useEffect(() => {
    let frame = 0;
    const update = () => {
      frame = 0;
      const el = ref.current;
      if (!el || watch.dragging) return;
      const next = windowSpanOf(el);
      setSpan((prev) => (prev && prev.top === next.top && prev.bottom === next.bottom ? prev : next));
    };
    const schedule = () => {
      if (!frame) frame = requestAnimationFrame(update);
    };
    update();
    window.addEventListener('scroll', schedule, { passive: true });
    window.addEventListener('resize', schedule);
    const sizes = new ResizeObserver(schedule);
    sizes.observe(document.body);
    if (ref.current) sizes.observe(ref.current);
    const off = watch.onEnd(schedule);
    return () => {
      if (frame) cancelAnimationFrame(frame);
      sizes.disconnect();
      off();
      window.removeEventListener('scroll', schedule);
      window.removeEventListener('resize', schedule);
    };
  }, [ref, watch]);
  return span;
}

/**
 * Of the cards a lane's virtualiser would mount (its view plus one card either side), those inside the
 * browser window too, with one card's estimate of margin either side, when the lane's box reaches
 * outside the window; the card being dragged and the selected barn's card always (the screen scrolls
 * the window to a barn picked on the map, so its card must be in the page). At least the first card of the lane's view stays,
 * so a lane below the window's edge still has a card to drop onto and to reach by keyboard. Positions
 * are the virtualiser's current ones (measured cards), read at render.
 */
function inWindow(items: VirtualItem[], span: WindowSpan | null, el: HTMLElement | null, keep: readonly number[]): VirtualItem[] {
  if (!span || !el || (span.top >= 0 && span.bottom <= window.innerHeight)) return items;
  const from = el.scrollTop + Math.max(0, -span.top) - CARD_ESTIMATE_PX;
  const to = el.scrollTop + Math.min(span.bottom, window.innerHeight) - span.top + CARD_ESTIMATE_PX;
  const seen = items.filter((v) => keep.includes(v.index) || (v.end >= from && v.start <= to));
  return seen.length || items.length === 0 ? seen : [items[0]!];
}

/**
 * One farrier's lane. Its stops scroll inside the lane and only the cards the dispatcher can see are
 * mounted (@tanstack/react-virtual), plus one card either side: inside the lane's scroll box *and*
 * inside the browser window, since the board usually sits below the map and a lane's lower half is
 * often below the window's edge. Every mounted sortable card re-renders whenever dnd-kit's drag state
 * changes (drag start, each new target, drop; several times while a card is lifted) and dnd-kit
 * measures every mounted card when a drag starts, so each mounted card costs time in every drag.
 * The card being dragged stays mounted wherever the lane is scrolled, because dnd-kit measures and
 * moves it. Cards are placed with `top`, not a transform, so dnd-kit's own transforms on them still
 * apply and no card becomes a compositing layer of its own.
 *
 * The lane itself reads no dnd-kit context: the drop target (`LaneFrame`) and the `SortableContext`
 * re-render on each change of drag state, but they receive the header and the list as ready-made
 * children, so React skips them and the virtualiser does not run again.
 *
 * When a barn is selected (on the map or on another card) the lane scrolls its stop there into view,
 * and after a drop the lane that receives the moved work scrolls to where it landed.
 */
const Lane = memo(function Lane({ route, units, selectedBarnId, activeStopId, revealJobId, retiming, watch, onSelectBarn, onMoves }: {
  route: PlanRouteView;
  units: 'miles' | 'km';
  selectedBarnId: number | null;
  /** The stop being dragged when it belongs to this lane, else null. */
  activeStopId: number | null;
  /** A job just moved by the dispatcher: the lane holding it scrolls to it. */
  revealJobId: number | null;
  /** The lane shows a drop whose times, figures and warnings the server is still working out. */
  retiming: boolean;
  /** The board's drag state (the lane keeps its mounted cards while a card is dragged). */
  watch: DragWatch;
  onSelectBarn: (id: number | null) => void;
  onMoves: (m: Move[]) => void;
}) {
  const empty = route.stops.length === 0;
  const laneWarnings = route.warnings;
  const items = useMemo(() => route.stops.map((s) => `stop:${s.id}`), [route.stops]);
  const scrollRef = useRef<HTMLDivElement>(null);
  const span = useWindowSpan(scrollRef, watch);
  const activeIndex = activeStopId === null ? -1 : route.stops.findIndex((s) => s.id === activeStopId);
  const selectedIndex = selectedBarnId === null ? -1 : route.stops.findIndex((s) => s.barnId === selectedBarnId);
  const stops = route.stops;
  const rangeExtractor = useCallback((range: Range) => {
    const out = defaultRangeExtractor(range);
    if (activeIndex >= 0 && !out.includes(activeIndex)) {
      out.push(activeIndex);
      out.sort((a, b) => a - b);
    }
    return out;
  }, [activeIndex]);
  const virtualizer = useVirtualizer({
    count: stops.length,
    getScrollElement: () => scrollRef.current,
    estimateSize: () => CARD_ESTIMATE_PX,
    getItemKey: (i) => stops[i]!.id,
    gap: CARD_GAP_PX,
    paddingStart: LANE_PADDING_PX,
    paddingEnd: LANE_PADDING_PX,
    overscan: 1,
    rangeExtractor,
  });

  // Bring a stop into the lane's view: the selected barn's (when the selection changes) or the one a drop just moved.
  const stopsRef = useRef(stops);
  stopsRef.current = stops;
  useEffect(() => {
    if (selectedBarnId === null) return;
    const i = stopsRef.current.findIndex((s) => s.barnId === selectedBarnId);
    if (i >= 0) virtualizer.scrollToIndex(i, { align: 'auto' });
  }, [selectedBarnId, virtualizer]);
  useEffect(() => {
    if (revealJobId === null) return;
    const i = stops.findIndex((s) => s.jobs.some((j) => j.id === revealJobId));
    if (i >= 0) virtualizer.scrollToIndex(i, { align: 'auto' });
  }, [revealJobId, stops, virtualizer]);

  const header = (
    <header className="rounded-t-xl border-b border-slateblue-100 px-3 py-2" style={{ borderTop: `4px solid ${route.colour}` }}>
      <div className="flex items-center justify-between gap-2">
        <h3 className="truncate text-sm font-semibold">{route.farrierName}</h3>
        {retiming && <span className="shrink-0 text-[11px] text-slateblue-500" role="status">re-timing…</span>}
        <span className="flex gap-1 text-[10px] font-semibold uppercase tracking-wide text-slateblue-500">
          {route.qualified && <span title="Qualified for therapeutic work">Thera</span>}
          {route.hasForge ? <span title="Truck has a forge">Forge</span> : <span className="text-ember-700" title="No forge on this truck">No forge</span>}
          {route.apprentice && <span>Apprentice</span>}
        </span>
      </div>
      {empty ? (
        <p className="mt-1 text-xs text-slateblue-500">No stops: drop work here</p>
      ) : (
        <dl className={`mt-1 grid grid-cols-3 gap-x-2 gap-y-0.5 text-[11px] text-slateblue-600 ${retiming ? 'opacity-50' : ''}`} data-testid="lane-figures">
          <div><dt className="sr-only">Day</dt><dd className="figure text-slateblue-900">{clock(route.start)}–{clock(route.end)}</dd></div>
          <div><dt className="sr-only">Drive</dt><dd className="figure">{hm(route.driveMinutes)} drive</dd></div>
          <div><dt className="sr-only">Distance</dt><dd className="figure">{route.distance.toFixed(1)} {unitWord(units)}</dd></div>
          <div><dt className="sr-only">Horses</dt><dd className="figure">{route.horses} horses</dd></div>
          <div><dt className="sr-only">Stops</dt><dd className="figure">{route.stops.length} stops</dd></div>
          <div><dt className="sr-only">Overtime</dt><dd className={`figure ${route.overtimeMinutes > 0 ? 'font-semibold text-ember-700' : ''}`}>{route.overtimeMinutes > 0 ? `+${route.overtimeMinutes} min OT` : 'no OT'}</dd></div>
        </dl>
      )}
      {laneWarnings.map((w, i) => (
        <p key={i} className="mt-1 rounded bg-ember-50 px-2 py-1 text-xs font-medium text-ember-800" data-warning={w.code}>{w.message}</p>
      ))}
      {route.cautions.map((c) => (
        <p key={c} className="mt-1 text-[11px] text-slateblue-500">⚠ {c}</p>
      ))}
    </header>
  );
  const list = (
    <div ref={scrollRef} className="max-h-[70vh] min-h-24 flex-1 overflow-y-auto" data-lane-scroll>
      <ol className="relative" style={{ height: virtualizer.getTotalSize() }} aria-label={`${route.stops.length} stops`}>
        {inWindow(virtualizer.getVirtualItems(), span, scrollRef.current, [activeIndex, selectedIndex]).map((v) => {
          const s = stops[v.index]!;
          return (
            <li key={v.key} ref={virtualizer.measureElement} data-index={v.index} className="absolute inset-x-2" style={{ top: v.start }}>
              <StopCard stop={s} farrierId={route.farrierId} units={units} selected={selectedBarnId === s.barnId} onSelectBarn={onSelectBarn} onMoves={onMoves} />
            </li>
          );
        })}
      </ol>
    </div>
  );
  return (
    <LaneFrame farrierId={route.farrierId} farrierName={route.farrierName} retiming={retiming} header={header}>
      <SortableContext id={`lane:${route.farrierId}`} items={items} strategy={verticalListSortingStrategy}>
        {list}
      </SortableContext>
    </LaneFrame>
  );
});

/**
 * A lane's drop target: the only part of a lane that follows dnd-kit's drag state (to ring the lane a
 * card is over). Its header and list arrive as elements made by the lane, so its re-renders stop here.
 */
function LaneFrame({ farrierId, farrierName, retiming, header, children }: { farrierId: number; farrierName: string; retiming: boolean; header: ReactNode; children: ReactNode }) {
  const { setNodeRef, isOver } = useDroppable({ id: `lane:${farrierId}` });
  return (
    <section ref={setNodeRef} className={`flex w-72 shrink-0 flex-col rounded-xl border bg-white shadow-sm ${isOver ? 'border-ember-400 ring-2 ring-ember-100' : 'border-slateblue-100'}`} data-lane={farrierId} data-retiming={retiming ? 'true' : undefined} aria-busy={retiming} aria-label={`Route of ${farrierName}`}>
      {header}
      {children}
    </section>
  );
}

/**
 * A stop's card: a thin sortable shell (it re-renders whenever dnd-kit's drag state changes, which is
 * unavoidable for a sortable item, hence the virtualised lane) around a memoised body that re-renders
 * only when the stop changes.
 */
const StopCard = memo(function StopCard({ stop, farrierId, units, selected, onSelectBarn, onMoves }: { stop: PlanStopView; farrierId: number; units: 'miles' | 'km'; selected: boolean; onSelectBarn: (id: number | null) => void; onMoves: (m: Move[]) => void }) {
  const { attributes, listeners, setNodeRef, transform, transition, isDragging } = useSortable({ id: `stop:${stop.id}` });
  const style = { transform: CSS.Translate.toString(transform), transition };
  return (
    <div
      ref={setNodeRef}
      style={style}
      {...attributes}
      {...listeners}
      onClick={() => onSelectBarn(selected ? null : stop.barnId)}
      aria-current={selected || undefined}
      className={`cursor-grab rounded-lg border bg-white p-2 text-sm outline-none focus-visible:ring-2 focus-visible:ring-ember-400 ${selected ? 'border-ember-500 ring-2 ring-ember-200' : 'border-slateblue-200'} ${stop.warnings.length ? 'border-l-4 border-l-ember-600' : ''} ${isDragging ? 'opacity-40' : ''}`}
      data-stop={stop.id}
      data-barn={stop.barnId}
      aria-label={`Stop ${stop.position}: ${stop.barnName}, arrival ${clock(stop.arrival)}`}
    >
      <StopBody stop={stop} farrierId={farrierId} units={units} onMoves={onMoves} />
    </div>
  );
});

/** The farrier's mark from the day sheet: arrived, done or skipped, with its time or reason. */
function StopProgress({ progress }: { progress: NonNullable<PlanStopView['progress']> }) {
  const tone = progress.state === 'done' ? 'bg-emerald-100 text-emerald-900' : progress.state === 'skipped' ? 'bg-ember-100 text-ember-900' : 'bg-hay-200 text-slateblue-900';
  const text =
    progress.state === 'done'
      ? `Done${progress.departed ? ` ${clock(progress.departed)}` : ''}`
      : progress.state === 'skipped'
        ? `Skipped${progress.skipReason ? `: ${progress.skipReason}` : ''}`
        : `Arrived${progress.arrived ? ` ${clock(progress.arrived)}` : ''}`;
  return (
    <p className={`mt-0.5 inline-block rounded px-1.5 py-0.5 text-[11px] font-semibold ${tone}`} data-progress={progress.state}>
      <span className="figure">{text}</span>
    </p>
  );
}

const StopBody = memo(function StopBody({ stop, farrierId, units, onMoves }: { stop: PlanStopView; farrierId: number; units: 'miles' | 'km'; onMoves: (m: Move[]) => void }) {
  const pinned = stop.jobs.length > 0 && stop.jobs.every((j) => j.pinned);
  const cautions = [...new Set(stop.jobs.flatMap((j) => j.cautions))];
  return (
    <>
      <div className="flex items-baseline justify-between gap-2">
        <span className="figure text-base font-medium text-slateblue-900">{clock(stop.arrival)}</span>
        <span className="figure text-[11px] text-slateblue-500" title="Drive into this stop">{stop.legDriveMinutes} min · {stop.legDistance.toFixed(1)} {unitWord(units)}</span>
      </div>
      <p className="truncate font-semibold">{stop.barnName}</p>
      {stop.progress && <StopProgress progress={stop.progress} />}
      {stop.window && <p className="figure text-[11px] text-slateblue-500">arrival window {clock(stop.window.start)}–{clock(stop.window.end)}</p>}
      <ul className="mt-1 space-y-0.5">
        {stop.jobs.map((j) => (
          <JobLine key={j.id} job={j} />
        ))}
      </ul>
      <div className="mt-1 flex items-center justify-between text-[11px] text-slateblue-500">
        <span className="figure">{stop.minutes} min on site · away {clock(stop.departure)}</span>
        <button
          type="button"
          className={`rounded px-1.5 py-0.5 font-semibold ${pinned ? 'bg-slateblue-800 text-white' : 'text-slateblue-600 hover:bg-slateblue-100'}`}
          onPointerDown={(e) => e.stopPropagation()}
          onKeyDown={(e) => e.stopPropagation()}
          onClick={(e) => {
            e.stopPropagation();
            onMoves(stop.jobs.map((j) => ({ jobId: j.id, toFarrierId: farrierId, position: stop.position, pin: !pinned })));
          }}
          aria-pressed={pinned}
          title={pinned ? 'Pinned: re-planning keeps this stop with this farrier' : 'Pin to this farrier'}
        >
          {pinned ? 'Pinned' : 'Pin'}
        </button>
      </div>
      {stop.warnings.map((w, i) => (
        <p key={i} className="mt-1 rounded bg-ember-50 px-2 py-1 text-xs font-medium text-ember-800" data-warning={w.code}>{w.message}</p>
      ))}
      {cautions.length > 0 && <p className="mt-1 text-[11px] leading-snug text-slateblue-500">⚠ {cautions.join(' · ')}</p>}
    </>
  );
});

function JobLine({ job }: { job: PlanJobView }) {
  return (
    <li className="flex items-baseline justify-between gap-2 text-xs">
      <span className="truncate">
        <span className="font-medium">{job.horseName}</span> <span className="text-slateblue-500">{job.workTypes.join(', ')}</span>
        {job.lame && <span className="ml-1 font-semibold text-ember-700">lame</span>}
      </span>
      <span className="figure shrink-0 text-slateblue-500">{job.minutes}m</span>
    </li>
  );
}

const UnplannedLane = memo(function UnplannedLane({ items, selectedBarnId, onSelectBarn }: { items: UnplannedView[]; selectedBarnId: number | null; onSelectBarn: (id: number | null) => void }) {
  const { setNodeRef, isOver } = useDroppable({ id: 'lane:unplanned' });
  const ids = useMemo(() => items.map((u) => `job:${u.jobId}`), [items]);
  return (
    <section ref={setNodeRef} className={`flex w-72 shrink-0 flex-col rounded-xl border bg-hay-50 ${isOver ? 'border-ember-400 ring-2 ring-ember-100' : 'border-hay-300'}`} data-lane="unplanned" aria-label="Unplanned jobs">
      <header className="border-b border-hay-200 px-3 py-2">
        <h3 className="text-sm font-semibold">Unplanned <span className="figure text-slateblue-500">{items.length}</span></h3>
        <p className="text-[11px] text-slateblue-500">Drag onto a farrier to plan; each shows why it was left out.</p>
      </header>
      <SortableContext id="lane:unplanned" items={ids} strategy={verticalListSortingStrategy}>
        <ol className="flex max-h-[70vh] min-h-24 flex-col gap-1.5 overflow-y-auto p-2">
          {items.map((u) => (
            <UnplannedCard key={u.jobId} item={u} selected={selectedBarnId === u.barnId} onSelectBarn={onSelectBarn} />
          ))}
        </ol>
      </SortableContext>
    </section>
  );
});

const UnplannedCard = memo(function UnplannedCard({ item, selected, onSelectBarn }: { item: UnplannedView; selected: boolean; onSelectBarn: (id: number | null) => void }) {
  const { attributes, listeners, setNodeRef, transform, transition, isDragging } = useSortable({ id: `job:${item.jobId}` });
  return (
    <li
      ref={setNodeRef}
      style={{ transform: CSS.Translate.toString(transform), transition }}
      {...attributes}
      {...listeners}
      onClick={() => onSelectBarn(selected ? null : item.barnId)}
      aria-current={selected || undefined}
      className={`cursor-grab rounded-md border bg-white px-2 py-1.5 text-xs outline-none focus-visible:ring-2 focus-visible:ring-ember-400 ${selected ? 'border-ember-500 ring-2 ring-ember-200' : 'border-hay-200'} ${isDragging ? 'opacity-40' : ''}`}
      data-job={item.jobId}
      data-barn={item.barnId}
    >
      <UnplannedBody item={item} />
    </li>
  );
});

const UnplannedBody = memo(function UnplannedBody({ item }: { item: UnplannedView }) {
  return (
    <>
      <div className="flex justify-between gap-2">
        <span className="truncate font-semibold">{item.job.horseName}{item.job.lame && <span className="ml-1 text-ember-700">lame</span>}</span>
        <span className="figure shrink-0 text-slateblue-500">due {item.job.dueOn.slice(5)}</span>
      </div>
      <p className="truncate text-slateblue-600">{item.barnName} · {item.job.workTypes.join(', ')} · <span className="figure">{item.job.minutes}m</span></p>
      <p className="text-[11px] text-slateblue-500">{item.reasonText}</p>
    </>
  );
});
