// The keyboard help, opened with "?".
import { useEffect, useRef } from "react";
import { shortcuts } from "./shortcuts.ts";
import { useSheet, useSheetActions } from "./sheetStore.ts";

export function ShortcutHelp() {
  const open = useSheet((s) => s.helpOpen);
  const readOnly = useSheet((s) => s.readOnly);
  const actions = useSheetActions();
  const dialog = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const el = dialog.current;
    if (!el) return;
    if (open && !el.open) el.showModal();
    if (!open && el.open) el.close();
  }, [open]);
  return (
    <dialog ref={dialog} className="ks-help panel" aria-labelledby="ks-help-title" onClose={() => actions.setHelpOpen(false)}>
      <h2 id="ks-help-title">Keys on the sheet</h2>
      <table className="data-table">
        <caption className="sr-only">Keyboard shortcuts</caption>
        <tbody>
          {shortcuts
            .filter((s) => !readOnly || !s.edits)
            .map((s) => (
              <tr key={s.keys}>
                <th scope="row">
                  <kbd>{s.keys}</kbd>
                </th>
                <td>{s.does}</td>
              </tr>
            ))}
        </tbody>
      </table>
      <p className="ks-muted">
        With the mouse: drag a part from the shelf; drag from a terminal dot to a busbar to connect; Shift-drag on the sheet to
        select a box; Shift-click to add to the selection. On a Mac, ⌘ works wherever Ctrl is written.
      </p>
      <form method="dialog">
        <button type="submit" className="btn btn-small btn-primary">
          Close
        </button>
      </form>
    </dialog>
  );
}
