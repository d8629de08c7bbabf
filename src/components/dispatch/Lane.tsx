/**
 * A farrier's lane on the dispatch board: the header with the day's figures, the virtualised list of
 * stop cards (only those inside both the lane's view and the browser window are mounted) and the
 * lane's drop target.
 */
import { memo, useCallback, useEffect, useMemo, useRef, type ReactNode } from 'react';
import { useDroppable } from '@dnd-kit/core';
import { SortableContext, verticalListSortingStrategy } from '@dnd-kit/sortable';
import { defaultRangeExtractor, useVirtualizer, type Range, type VirtualItem } from '@tanstack/react-virtual';
import type { Move, PlanRouteView } from '../../schemas/plans.ts';
import { clock, hm } from './format.ts';
import { unitLabel } from '../../lib/review/mileage.ts';
import { StopCard } from './StopCard.tsx';
import { useWindowSpan, type DragWatch, type WindowSpan } from './window-span.ts';

/** A card's height before it is measured (a one-horse stop without warnings), and the space between cards. */
const CARD_ESTIMATE_PX = 136;
const CARD_GAP_PX = 8;
const LANE_PADDING_PX = 8;

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
export const Lane = memo(function Lane({ route, units, selectedBarnId, activeStopId, revealJobId, retiming, watch, onSelectBarn, onMoves }: {
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
          <div><dt className="sr-only">Distance</dt><dd className="figure">{route.distance.toFixed(1)} {unitLabel(units)}</dd></div>
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
