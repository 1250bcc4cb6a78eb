// The bar between the drawing and Results: drag it, or focus it and use the arrow keys, to give
// Results more or less of the height. The share is kept within bounds so neither disappears.
import { useRef, type KeyboardEvent, type PointerEvent } from "react";

/** Results' share of the centre's height before the window is measured (and on a phone, where they stack). */
export const DEFAULT_RESULTS_SHARE = 20;
const MIN_SHARE = 10;
const MAX_SHARE = 70;
/** A first height never gives Results more than this; the planner may drag further. */
const MAX_FIRST_SHARE = 45;
/** By default the drawing keeps this share of the window's height (the issue asks at least 60 %). */
const DRAWING_WINDOW_SHARE = 0.605;
/** The splitter bar's own height (0.6 rem). */
const SPLITTER_PX = 10;
const KEY_STEP = 5;

const bounded = (share: number) => Math.min(MAX_SHARE, Math.max(MIN_SHARE, Math.round(share)));

/**
 * Results' first share of the centre: all the height the drawing can spare once it keeps 60.5 % of
 * the window, so a 720-pixel window shows several rows of results instead of one, and a tall
 * window does not hand Results more than 45 %.
 */
export function firstResultsShare(centrePx: number, windowPx: number): number {
  if (!(centrePx > 0) || !(windowPx > 0)) return DEFAULT_RESULTS_SHARE;
  return Math.min(MAX_FIRST_SHARE, bounded(Math.floor(((centrePx - SPLITTER_PX - DRAWING_WINDOW_SHARE * windowPx) / centrePx) * 100)));
}

export function ResultsSplitter({ share, onChange }: { share: number; onChange(share: number): void }) {
  const dragging = useRef<{ top: number; height: number } | null>(null);

  const onPointerDown = (event: PointerEvent<HTMLDivElement>) => {
    const centre = event.currentTarget.parentElement?.getBoundingClientRect();
    if (!centre) return;
    dragging.current = { top: centre.top, height: centre.height };
    event.currentTarget.setPointerCapture(event.pointerId);
  };
  const onPointerMove = (event: PointerEvent<HTMLDivElement>) => {
    const frame = dragging.current;
    if (!frame || frame.height <= 0) return;
    onChange(bounded(((frame.top + frame.height - event.clientY) / frame.height) * 100));
  };
  const onPointerUp = () => {
    dragging.current = null;
  };
  const onKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    const change: Record<string, number> = { ArrowUp: KEY_STEP, ArrowDown: -KEY_STEP, Home: MAX_SHARE - share, End: MIN_SHARE - share };
    if (!(event.key in change)) return;
    event.preventDefault();
    onChange(bounded(share + change[event.key]));
  };

  return (
    <div
      className="ks-splitter"
      role="separator"
      aria-orientation="horizontal"
      aria-label="Height of Results"
      aria-valuenow={share}
      aria-valuemin={MIN_SHARE}
      aria-valuemax={MAX_SHARE}
      aria-valuetext={`Results take ${share} % of the height`}
      tabIndex={0}
      onPointerDown={onPointerDown}
      onPointerMove={onPointerMove}
      onPointerUp={onPointerUp}
      onPointerCancel={onPointerUp}
      onKeyDown={onKeyDown}
    >
      <span aria-hidden="true" className="ks-splitter-grip" />
    </div>
  );
}
