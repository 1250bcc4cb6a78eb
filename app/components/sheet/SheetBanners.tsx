// Banners over the sheet: a save that met a newer revision, a draft left in this browser, and
// short notices of what the sheet did on the planner's behalf.
import { useEffect } from "react";
import type { Draft } from "./draftStorage.ts";
import { useSheet, useSheetActions } from "./sheetStore.ts";

export function ConflictBanner({ onReloadTheirs, onKeepMine }: { onReloadTheirs(): void; onKeepMine(): void }) {
  const save = useSheet((s) => s.save);
  if (save.kind !== "conflict") return null;
  return (
    <div className="notice notice-error ks-banner" role="alert">
      <p>
        <strong>Someone saved a newer revision</strong> (revision {save.currentRevision}) while you were editing. Nothing was
        overwritten: your changes are still here and kept in this browser.
      </p>
      <div className="ks-button-row">
        <button type="button" className="btn btn-small" onClick={onReloadTheirs}>
          Reload theirs
        </button>
        <button type="button" className="btn btn-small btn-primary" onClick={onKeepMine}>
          Keep mine as a new revision
        </button>
      </div>
      <p className="ks-muted">Reloading theirs can be undone, which brings yours back.</p>
    </div>
  );
}

export function DraftBanner({ draft, savedRevision, onRestore, onDiscard }: { draft: Draft; savedRevision: number; onRestore(): void; onDiscard(): void }) {
  const when = new Date(draft.writtenAt);
  const stamp = Number.isNaN(when.getTime()) ? "earlier" : when.toISOString().slice(0, 16).replace("T", " ") + " UTC";
  return (
    <div className="notice notice-info ks-banner" role="status">
      <p>
        <strong>Unsaved changes from {stamp}</strong> are kept in this browser
        {draft.baseRevision === savedRevision
          ? "."
          : `, made on revision ${draft.baseRevision}; revision ${savedRevision} has been saved since. Restoring saves yours as a new revision.`}
      </p>
      <div className="ks-button-row">
        <button type="button" className="btn btn-small btn-primary" onClick={onRestore}>
          Restore my changes
        </button>
        <button type="button" className="btn btn-small" onClick={onDiscard}>
          Discard them
        </button>
      </div>
    </div>
  );
}

export function NoticeToast() {
  const notice = useSheet((s) => s.notice);
  const actions = useSheetActions();
  useEffect(() => {
    if (!notice) return;
    const timer = setTimeout(actions.dismissNotice, 6000);
    return () => clearTimeout(timer);
  }, [notice, actions]);
  if (!notice) return null;
  return (
    <div className="notice notice-info ks-toast" role="status">
      {notice}{" "}
      <button type="button" className="btn btn-small" onClick={actions.dismissNotice}>
        OK
      </button>
    </div>
  );
}
