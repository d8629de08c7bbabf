/** The board's unplanned lane and its job cards. */
import { memo, useMemo } from 'react';
import { useDroppable } from '@dnd-kit/core';
import { SortableContext, useSortable, verticalListSortingStrategy } from '@dnd-kit/sortable';
import { CSS } from '@dnd-kit/utilities';
import type { UnplannedView } from '../../schemas/plans.ts';

/**
 * Jobs left off the day's plan, each with why, to be dragged onto a farrier. The lane is a drop target
 * too: a card dropped here takes its work off the plan.
 */
export const UnplannedLane = memo(function UnplannedLane({ items, selectedBarnId, onSelectBarn }: { items: UnplannedView[]; selectedBarnId: number | null; onSelectBarn: (id: number | null) => void }) {
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
