// The bar above the sheet: the panels, history, layout and view actions, and the save state.
// It stays one slim row: longer explanations go to Checks or a tooltip, never into the bar.
import { useId, useMemo } from "react";
import { useReactFlow } from "@xyflow/react";
import { availableView, caseChoices, caseViewValue } from "./caseView.ts";
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
    case "draft":
      return {
        icon: "✓",
        text: `Saved as a draft · ${save.problems.length} ${save.problems.length === 1 ? "problem" : "problems"}`,
        tone: "ks-save-draft",
        detail: "Not a complete network yet; the server keeps it as it is. Checks lists what is left to do.",
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
    <div className={`ks-save ${shown.tone}`} role="status" aria-live="polite" title={shown.detail}>
      <span aria-hidden="true" className="ks-save-icon">
        {shown.icon}
      </span>
      <span className="ks-save-text">{shown.text}</span>
      <span className="ks-muted ks-save-revision"> · revision {revision}</span>
      {shown.detail ? <span className="sr-only">{shown.detail}</span> : null}
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

export interface PanelToggles {
  shelfOpen: boolean;
  dockOpen: boolean;
  onShelf(): void;
  onDock(): void;
}

/** "Solved in" only for a load flow that converged: beside "did not converge" it would mislead. */
function useSolvedInMs(): number | undefined {
  return useSheet((s) =>
    s.solve.kind === "envelope"
      ? s.solve.envelope.elapsedMs
      : s.solve.kind === "solved" && s.solve.readings.result.loadFlow.converged
        ? s.solve.readings.elapsedMs
        : undefined,
  );
}

/** Which operating case Readings and Results show; only a network with cases offers a choice. */
export function CasePicker() {
  const actions = useSheetActions();
  const cases = useSheet((s) => s.document.cases);
  const view = useSheet((s) => s.caseView);
  const choices = useMemo(() => caseChoices({ cases }), [cases]);
  const id = useId();
  if (choices.length === 0) return null;
  const value = caseViewValue(availableView({ cases }, view));
  return (
    <div className="ks-case-picker">
      <label htmlFor={id}>Case</label>
      <select
        id={id}
        className="ks-case-select"
        value={value}
        onChange={(event) => {
          const chosen = choices.find((c) => c.value === event.target.value);
          if (chosen) actions.setCaseView(chosen.view);
        }}
        title="The operating case the Readings and Results show, or the envelope across all of them"
      >
        {choices.map((c) => (
          <option key={c.value} value={c.value}>
            {c.label}
          </option>
        ))}
      </select>
    </div>
  );
}

export function SheetToolbar({ onFit, panels }: { onFit(): void; panels: PanelToggles }) {
  const actions = useSheetActions();
  const readOnly = useSheet((s) => s.readOnly);
  const showReadings = useSheet((s) => s.showReadings);
  const showFaults = useSheet((s) => s.showFaults);
  const canUndo = useSheetHistory((h) => h.pastStates.length > 0);
  const canRedo = useSheetHistory((h) => h.futureStates.length > 0);
  const elapsedMs = useSolvedInMs();
  const { zoomIn, zoomOut } = useReactFlow();
  return (
    <div className="ks-toolbar" role="toolbar" aria-label="Sheet tools">
      {readOnly ? null : (
        <button type="button" className="btn btn-small ks-panel-toggle" aria-expanded={panels.shelfOpen} onClick={panels.onShelf}>
          Parts
        </button>
      )}
      {readOnly ? null : (
        <div className="ks-tool-group">
          <button type="button" className="btn btn-small" onClick={actions.undo} disabled={!canUndo} aria-keyshortcuts="Control+Z">
            Undo
          </button>
          <button type="button" className="btn btn-small" onClick={actions.redo} disabled={!canRedo} aria-keyshortcuts="Control+Y Control+Shift+Z">
            Redo
          </button>
          <button type="button" className="btn btn-small" onClick={() => void actions.arrange().then(() => afterNextPaint(onFit))} aria-keyshortcuts="Shift+L">
            Arrange
          </button>
        </div>
      )}
      <div className="ks-tool-group" role="group" aria-label="Zoom">
        <button type="button" className="btn btn-small ks-zoom" onClick={() => void zoomOut({ duration: 150 })} aria-label="Zoom out" aria-keyshortcuts="-">
          −
        </button>
        <button type="button" className="btn btn-small ks-zoom" onClick={() => void zoomIn({ duration: 150 })} aria-label="Zoom in" aria-keyshortcuts="+">
          +
        </button>
        <button type="button" className="btn btn-small" onClick={onFit} aria-keyshortcuts="F">
          Fit
        </button>
      </div>
      <CasePicker />
      <div className="ks-tool-group">
        <button type="button" className="btn btn-small" aria-pressed={showReadings} onClick={() => actions.setShowReadings(!showReadings)} aria-keyshortcuts="R">
          Readings
        </button>
        <button type="button" className="btn btn-small" aria-pressed={showFaults} onClick={() => actions.setShowFaults(!showFaults)} aria-keyshortcuts="K">
          Fault levels (kA)
        </button>
        <button type="button" className="btn btn-small ks-keys" onClick={() => actions.setHelpOpen(true)} aria-keyshortcuts="Shift+?">
          Keys <kbd>?</kbd>
        </button>
      </div>
      <div className="ks-tool-end">
        {elapsedMs !== undefined ? <span className="ks-muted ks-solve-time">solved in {fixed(elapsedMs, 1)} ms</span> : null}
        <SaveIndicator />
        <button type="button" className="btn btn-small ks-panel-toggle" aria-expanded={panels.dockOpen} aria-controls="ks-dock" onClick={panels.onDock}>
          Details
        </button>
      </div>
    </div>
  );
}
