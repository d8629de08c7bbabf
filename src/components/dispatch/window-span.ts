/**
 * A lane's place in the browser window and the board's drag state, so that lanes mount only the cards
 * a dispatcher can see and hold them still while a card is dragged.
 */
import { useEffect, useState, type RefObject } from 'react';

/**
 * The part of the browser window a lane's scroll box shows, in window pixels (`top` may be negative
 * when the page is scrolled past the lane's top). Lanes follow the window's scrolling with this so that
 * they mount only the cards a dispatcher can see.
 */
export type WindowSpan = { top: number; bottom: number };

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
export class DragWatch {
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
export function useWindowSpan(ref: RefObject<HTMLElement | null>, watch: DragWatch): WindowSpan | null {
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
