// The sheet's keyboard shortcuts. Undo and redo use the keys every program uses; the rest are
// our own, listed in the help overlay that "?" opens.
import { useEffect } from "react";
import { GRID_PX } from "./flowModel.ts";
import { partKinds, partNames, type PartKind } from "./sheetEdits.ts";
import type { SheetStore } from "./sheetStore.ts";

export interface Shortcut {
  keys: string;
  does: string;
  /** Only where the planner may edit. */
  edits?: boolean;
}

export const shortcuts: Shortcut[] = [
  { keys: "Ctrl+Z", does: "Undo", edits: true },
  { keys: "Ctrl+Shift+Z or Ctrl+Y", does: "Redo", edits: true },
  { keys: "Delete or Backspace", does: "Delete the selection (a selected wire comes loose)", edits: true },
  { keys: "Ctrl+C / Ctrl+X / Ctrl+V", does: "Copy, cut, paste", edits: true },
  { keys: "Ctrl+D", does: "Duplicate the selection", edits: true },
  { keys: "Ctrl+A", does: "Select everything" },
  { keys: "Esc", does: "Clear the selection, close this help" },
  { keys: "Arrow keys", does: `Move the selection one grid step (${GRID_PX} px); with Shift, five`, edits: true },
  {
    keys: `1 to ${partKinds.length}`,
    does: `Place a part in the middle of the view: ${partKinds.map((part, i) => `${i + 1} ${partNames[part].toLowerCase()}`).join(", ")}`,
    edits: true,
  },
  { keys: "Shift+L", does: "Lay the chain out left to right", edits: true },
  { keys: "F", does: "Fit the drawing to the view" },
  { keys: "+ / −", does: "Zoom in, zoom out" },
  { keys: "R", does: "Show or hide Readings" },
  { keys: "K", does: "Show or hide fault levels (kA)" },
  { keys: "?", does: "This help" },
];

/** After the browser has drawn what a change produced: two frames, since the sheet renders in between. */
export function afterNextPaint(run: () => void): void {
  requestAnimationFrame(() => requestAnimationFrame(run));
}

function typingInto(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false;
  return target.isContentEditable || ["INPUT", "TEXTAREA", "SELECT"].includes(target.tagName);
}

/** Marks the Details inputs: their value is the sheet's, so the sheet's history owns their undo. */
export const SHEET_FIELD_ATTRIBUTE = "data-sheet-field";
/** Set on a Details input while it holds typing that is not committed yet. */
export const UNCOMMITTED_ATTRIBUTE = "data-uncommitted";
/** Sent to a Details input to drop its uncommitted typing and show the sheet's value again. */
export const REVERT_FIELD_EVENT = "kilostep:revert-field";

function historyKey(event: KeyboardEvent): "undo" | "redo" | undefined {
  if (!(event.ctrlKey || event.metaKey) || event.altKey) return undefined;
  const lower = event.key.toLowerCase();
  if (lower === "z") return event.shiftKey ? "redo" : "undo";
  if (lower === "y" && !event.shiftKey) return "redo";
  return undefined;
}

/**
 * Ctrl+Z and Ctrl+Y belong to the sheet anywhere on the page, Details fields included: the
 * browser's own text undo would put back characters the sheet never held (and the next Tab would
 * save them). A field with uncommitted typing first drops that typing; the next press undoes the
 * sheet. Other text boxes on the page (a review note) keep their own text undo.
 */
function ownHistoryKey(event: KeyboardEvent, store: SheetStore): boolean {
  const which = historyKey(event);
  if (!which) return false;
  const target = event.target instanceof HTMLElement ? event.target : null;
  const inSheetField = !!target?.closest(`[${SHEET_FIELD_ATTRIBUTE}]`);
  if (typingInto(target) && !inSheetField) return false;
  event.preventDefault();
  const { actions, readOnly } = store.getState();
  if (target && inSheetField && target.hasAttribute(UNCOMMITTED_ATTRIBUTE)) {
    target.dispatchEvent(new CustomEvent(REVERT_FIELD_EVENT));
    if (which === "undo") return true;
  }
  if (!readOnly) (which === "undo" ? actions.undo : actions.redo)();
  return true;
}

export interface ShortcutHandlers {
  fit(): void;
  zoom(direction: "in" | "out"): void;
  placeAtCentre(part: PartKind): void;
  nudge(dx: number, dy: number): void;
}

/** Keys act on the sheet from anywhere in the editor except while typing in a field (undo and redo: see above). */
export function useSheetShortcuts(store: SheetStore, root: React.RefObject<HTMLElement | null>, handlers: ShortcutHandlers): void {
  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (event.defaultPrevented || ownHistoryKey(event, store) || typingInto(event.target)) return;
      // Keys belong to this editor when focus is inside it, or on the page around it (body, main).
      const editor = root.current;
      const target = event.target as Node;
      if (!editor || !(editor.contains(target) || target.contains(editor))) return;
      const state = store.getState();
      const { actions, readOnly } = state;
      const mod = event.ctrlKey || event.metaKey;
      const key = event.key;
      const run = (action: () => void) => {
        event.preventDefault();
        action();
      };
      if (state.helpOpen) {
        if (key === "Escape" || key === "?") run(() => actions.setHelpOpen(false));
        return;
      }
      if (mod && !event.altKey) {
        const lower = key.toLowerCase();
        if (lower === "a") return run(actions.selectAll);
        if (lower === "c") return run(actions.copySelection);
        if (readOnly) return;
        if (lower === "x")
          return run(() => {
            actions.copySelection();
            actions.deleteSelection();
          });
        if (lower === "v") return run(actions.paste);
        if (lower === "d")
          return run(() => {
            actions.copySelection();
            actions.paste();
          });
        return;
      }
      if (event.altKey) return;
      if (key === "?") return run(() => actions.setHelpOpen(true));
      if (key === "Escape") return run(() => actions.select([]));
      if (key === "f" || key === "F") return run(handlers.fit);
      if (key === "+" || key === "=") return run(() => handlers.zoom("in"));
      if (key === "-") return run(() => handlers.zoom("out"));
      if (key === "r" || key === "R") return run(() => actions.setShowReadings(!state.showReadings));
      if (key === "k" || key === "K") return run(() => actions.setShowFaults(!state.showFaults));
      if (readOnly) return;
      if (key === "L" && event.shiftKey) return run(() => void actions.arrange().then(() => afterNextPaint(handlers.fit)));
      if (key === "Delete" || key === "Backspace") return run(actions.deleteSelection);
      const digit = Number(key);
      if (Number.isInteger(digit) && digit >= 1 && digit <= partKinds.length)
        return run(() => handlers.placeAtCentre(partKinds[digit - 1]));
      const step = event.shiftKey ? GRID_PX * 5 : GRID_PX;
      const arrows: Record<string, [number, number]> = {
        ArrowLeft: [-step, 0],
        ArrowRight: [step, 0],
        ArrowUp: [0, -step],
        ArrowDown: [0, step],
      };
      // A focused node moves by xyflow's own arrow-key handling; elsewhere the selection moves.
      if (arrows[key] && state.selection.length && !(event.target as HTMLElement).closest?.(".react-flow__node"))
        return run(() => handlers.nudge(...arrows[key]));
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [store, root, handlers]);
}
