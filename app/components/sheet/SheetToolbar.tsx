// The bar above the sheet: history, layout and view actions, the save state, the voltage legend.
import { fixed } from "#app/lib/format.ts";
import { afterNextPaint } from "./shortcuts.ts";
import { useSheet, useSheetActions, useSheetHistory, type SaveStatus } from "./sheetStore.ts";
import { voltageClasses } from "./voltageClasses.ts";

function saveText(save: SaveStatus, readOnly: boolean): { icon: string; text: string; tone: string; detail?: string } {
  if (readOnly) return { icon: "◇", text: "Read only", tone: "ks-save-quiet", detail: "You can look and solve; your role does not allow edits." };
  switch (save.kind) {
    case "saved":
      return { icon: "✓", text: "Saved", tone: "ks-save-ok" };
    case "pending":
      return { icon: "…", text: "Saving…", tone: "ks-save-quiet" };
    case "saving":
      return { icon: "↻", text: "Saving…", tone: "ks-save-quiet" };
    case "offline":
      return { icon: "⚡", text: "Offline", tone: "ks-save-warn", detail: "Changes are kept in this browser and saved when the connection is back." };
    case "invalid":
      return {
        icon: "✕",
        text: "Not saved",
        tone: "ks-save-bad",
        detail: `Not a complete network yet: ${save.issues[0]?.message ?? ""}${save.issues.length > 1 ? ` (and ${save.issues.length - 1} more, see Checks)` : ""}. Kept in this browser.`,
      };
    case "conflict":
      return { icon: "✕", text: "Not saved", tone: "ks-save-bad", detail: "Someone saved a newer revision." };
    case "refused":
      return { icon: "✕", text: "Not saved", tone: "ks-save-bad", detail: save.message };
  }
}

export function SaveIndicator() {
  const save = useSheet((s) => s.save);
  const readOnly = useSheet((s) => s.readOnly);
  const revision = useSheet((s) => s.savedRevision);
  const shown = saveText(save, readOnly);
  return (
    <div className={`ks-save ${shown.tone}`} role="status" aria-live="polite">
      <span aria-hidden="true" className="ks-save-icon">
        {shown.icon}
      </span>
      <span className="ks-save-text">{shown.text}</span>
      <span className="ks-muted"> · revision {revision}</span>
      {shown.detail ? <span className="ks-save-detail">{shown.detail}</span> : null}
    </div>
  );
}

export function VoltageLegend() {
  return (
    <div className="ks-legend" aria-label="Line weight and colour by voltage class">
      {voltageClasses.map((c) => (
        <span key={c.id} className="ks-legend-item">
          <svg width="26" height="10" aria-hidden="true" focusable="false">
            <line x1="1" y1="5" x2="25" y2="5" style={{ stroke: c.colour, strokeWidth: c.strokePx }} />
          </svg>
          {c.label}
        </span>
      ))}
    </div>
  );
}

export function SheetToolbar({ onFit }: { onFit(): void }) {
  const actions = useSheetActions();
  const readOnly = useSheet((s) => s.readOnly);
  const showReadings = useSheet((s) => s.showReadings);
  const showFaults = useSheet((s) => s.showFaults);
  const canUndo = useSheetHistory((h) => h.pastStates.length > 0);
  const canRedo = useSheetHistory((h) => h.futureStates.length > 0);
  const elapsedMs = useSheet((s) => (s.solve.kind === "solved" ? s.solve.readings.elapsedMs : undefined));
  return (
    <div className="ks-toolbar" role="toolbar" aria-label="Sheet tools">
      {readOnly ? null : (
        <div className="ks-tool-group">
          <button type="button" className="btn btn-small" onClick={actions.undo} disabled={!canUndo} aria-keyshortcuts="Control+Z">
            Undo
          </button>
          <button type="button" className="btn btn-small" onClick={actions.redo} disabled={!canRedo} aria-keyshortcuts="Control+Shift+Z">
            Redo
          </button>
          <button type="button" className="btn btn-small" onClick={() => void actions.arrange().then(() => afterNextPaint(onFit))} aria-keyshortcuts="Shift+L">
            Arrange
          </button>
        </div>
      )}
      <div className="ks-tool-group">
        <button type="button" className="btn btn-small" onClick={onFit} aria-keyshortcuts="F">
          Fit
        </button>
        <button type="button" className="btn btn-small" aria-pressed={showReadings} onClick={() => actions.setShowReadings(!showReadings)} aria-keyshortcuts="R">
          Readings
        </button>
        <button type="button" className="btn btn-small" aria-pressed={showFaults} onClick={() => actions.setShowFaults(!showFaults)} aria-keyshortcuts="K">
          Fault levels (kA)
        </button>
        <button type="button" className="btn btn-small" onClick={() => actions.setHelpOpen(true)} aria-keyshortcuts="Shift+?">
          Keys <kbd>?</kbd>
        </button>
      </div>
      <VoltageLegend />
      <div className="ks-tool-end">
        {elapsedMs !== undefined ? <span className="ks-muted ks-solve-time">solved in {fixed(elapsedMs, 1)} ms</span> : null}
        <SaveIndicator />
      </div>
    </div>
  );
}
