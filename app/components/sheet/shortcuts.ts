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

export interface ShortcutHandlers {
  fit(): void;
  placeAtCentre(part: PartKind): void;
  nudge(dx: number, dy: number): void;
}

/** Keys act on the sheet from anywhere in the editor except while typing in a field. */
export function useSheetShortcuts(store: SheetStore, root: React.RefObject<HTMLElement | null>, handlers: ShortcutHandlers): void {
  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (event.defaultPrevented || typingInto(event.target)) return;
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
        if (lower === "z" && !event.shiftKey && !readOnly) return run(actions.undo);
        if (((lower === "z" && event.shiftKey) || lower === "y") && !readOnly) return run(actions.redo);
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
