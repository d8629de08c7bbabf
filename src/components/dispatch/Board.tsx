/**
 * The dispatch board: one lane per farrier plus the unplanned lane. Stops (and single jobs) are dragged
 * with dnd-kit, by mouse or keyboard (focus a card, Space to lift, arrow keys to move, Space to drop).
 * A drop becomes moves for the plans API; the server re-times and answers, nothing moves on its own.
 * This module holds the drag context, the lane-first collision detection and the drop's moves; the
 * lanes (Lane.tsx, UnplannedLane.tsx), the stop cards (StopCard.tsx) and the lanes' window tracking
 * (window-span.ts) live beside it.
 */
import { memo, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import {
  DndContext, DragOverlay, KeyboardSensor, PointerSensor, closestCenter, useSensor, useSensors,
  type Collision, type CollisionDetection, type DragEndEvent, type DragStartEvent,
} from '@dnd-kit/core';
import { sortableKeyboardCoordinates } from '@dnd-kit/sortable';
import type { Move, PlanJobView, PlanRouteView, PlanStopView, UnplannedView } from '../../schemas/plans.ts';
import { clock } from './format.ts';
import { Lane } from './Lane.tsx';
import { UnplannedLane } from './UnplannedLane.tsx';
import { DragWatch } from './window-span.ts';

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
