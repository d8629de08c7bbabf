/**
 * A stop's card on a farrier's lane: arrival, barn, the farrier's mark, the horses and their work, the
 * pin, warnings and cautions.
 */
import { memo } from 'react';
import { useSortable } from '@dnd-kit/sortable';
import { CSS } from '@dnd-kit/utilities';
import type { Move, PlanJobView, PlanStopView } from '../../schemas/plans.ts';
import { clock } from './format.ts';
import { unitLabel } from '../../lib/review/mileage.ts';

/**
 * A stop's card: a thin sortable shell (it re-renders whenever dnd-kit's drag state changes, which is
 * unavoidable for a sortable item, hence the virtualised lane) around a memoised body that re-renders
 * only when the stop changes.
 */
export const StopCard = memo(function StopCard({ stop, farrierId, units, selected, onSelectBarn, onMoves }: { stop: PlanStopView; farrierId: number; units: 'miles' | 'km'; selected: boolean; onSelectBarn: (id: number | null) => void; onMoves: (m: Move[]) => void }) {
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
        <span className="figure text-[11px] text-slateblue-500" title="Drive into this stop">{stop.legDriveMinutes} min · {stop.legDistance.toFixed(1)} {unitLabel(units)}</span>
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
