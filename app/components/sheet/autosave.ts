// Every edit is saved: shortly after the planner stops, the document goes to
// PUT /api/networks/:id with the revision it was made on. A newer revision on the server stops
// saving and asks the planner (reload theirs, or keep mine as a new revision); nothing is
// overwritten silently. Until the server confirms, the edits are kept in this browser. A drawing
// that is not a complete network yet is saved all the same: the server keeps it as a draft and
// lists its problems, so a cleared browser or a colleague's browser loses nothing.
import { validateDraft, type Network } from "#solver/schema.ts";
import { clearDrafts, writeDraft, writeLayout } from "./draftStorage.ts";
import { savedState, type SheetStore } from "./sheetStore.ts";

export const AUTOSAVE_DELAY_MS = 600;
const OFFLINE_RETRY_MS = 5000;

export interface AutosaveEnvironment {
  fetch: typeof fetch;
  storage?: Pick<Storage, "getItem" | "setItem" | "removeItem" | "key" | "length">;
  isOnline: () => boolean;
  /** Calls back when the browser is online again; returns the unsubscribe. */
  onOnline: (callback: () => void) => () => void;
  now: () => Date;
}

export interface Autosave {
  /** After a conflict: save my document as the revision after theirs. */
  keepMine(): void;
  /** After a conflict: take their revision (an undoable edit, so mine is one undo away). */
  reloadTheirs(): Promise<void>;
  stop(): void;
}

export function browserEnvironment(): AutosaveEnvironment {
  return {
    fetch: (...args) => window.fetch(...args),
    storage: window.localStorage,
    isOnline: () => navigator.onLine,
    onOnline: (callback) => {
      window.addEventListener("online", callback);
      return () => window.removeEventListener("online", callback);
    },
    now: () => new Date(),
  };
}

async function readJson(response: Response): Promise<Record<string, unknown>> {
  try {
    const body: unknown = await response.json();
    return body && typeof body === "object" ? (body as Record<string, unknown>) : {};
  } catch {
    return {};
  }
}

export function startAutosave(store: SheetStore, env: AutosaveEnvironment): Autosave {
  const { networkId } = store.getState();
  const url = `/api/networks/${encodeURIComponent(networkId)}`;
  const actions = () => store.getState().actions;
  let timer: ReturnType<typeof setTimeout> | undefined;
  let inFlight = false;
  let again = false;
  let stopped = false;

  const schedule = (delay = AUTOSAVE_DELAY_MS) => {
    clearTimeout(timer);
    if (!stopped) timer = setTimeout(attempt, delay);
  };

  const markClean = () => {
    actions().setSave(savedState(store.getState().document));
    if (env.storage) clearDrafts(env.storage, networkId);
  };

  async function attempt(): Promise<void> {
    const state = store.getState();
    if (stopped || state.readOnly || state.save.kind === "conflict") return;
    if (state.document === state.savedDocument) {
      markClean();
      return;
    }
    if (!env.isOnline()) {
      actions().setSave({ kind: "offline" });
      return;
    }
    if (inFlight) {
      again = true;
      return;
    }
    inFlight = true;
    actions().setSave({ kind: "saving" });
    const document: Network = state.document;
    try {
      const response = await env.fetch(url, {
        method: "PUT",
        headers: { "content-type": "application/json", accept: "application/json" },
        credentials: "same-origin",
        body: JSON.stringify({ revision: state.savedRevision, foldedSaves: state.savedFoldedSaves, document }),
      });
      const body = await readJson(response);
      if (response.ok && typeof body.revision === "number") {
        actions().markSaved(body.revision, document, typeof body.foldedSaves === "number" ? body.foldedSaves : undefined);
        if (store.getState().document === document) markClean();
        else again = true;
      } else if (response.status === 409 && typeof body.currentRevision === "number") {
        actions().setSave({
          kind: "conflict",
          currentRevision: body.currentRevision,
          message: typeof body.error === "string" ? body.error : `Revision ${body.currentRevision} was saved in the meantime.`,
        });
      } else if (response.status === 401 || response.status === 403) {
        actions().setSave({
          kind: "refused",
          message: "The server no longer accepts your edits here (signed out, or your role changed). Your changes are kept in this browser.",
        });
      } else {
        actions().setSave({
          kind: "refused",
          message: typeof body.error === "string" ? body.error : `The server answered ${response.status}; your changes are kept in this browser.`,
        });
      }
    } catch {
      actions().setSave({ kind: "offline" });
      schedule(OFFLINE_RETRY_MS);
    } finally {
      inFlight = false;
      if (again) {
        again = false;
        schedule();
      }
    }
  }

  const unsubscribe = store.subscribe((state, previous) => {
    if (state.layout !== previous.layout && env.storage) writeLayout(env.storage, networkId, state.layout);
    if (state.document === previous.document && state.savedRevision === previous.savedRevision) return;
    if (state.document === state.savedDocument) return;
    if (env.storage)
      writeDraft(env.storage, {
        networkId,
        baseRevision: state.savedRevision,
        document: state.document,
        layout: state.layout,
        writtenAt: env.now().toISOString(),
      });
    if (state.document !== previous.document && state.save.kind !== "conflict") {
      if (state.save.kind !== "pending") actions().setSave({ kind: "pending" });
      schedule();
    }
  });
  const stopListening = env.onOnline(() => {
    if (store.getState().save.kind === "offline") schedule(0);
  });

  return {
    keepMine() {
      const state = store.getState();
      if (state.save.kind !== "conflict") return;
      actions().setSavedRevision(state.save.currentRevision, state.savedDocument);
      actions().setSave({ kind: "pending" });
      schedule(0);
    },
    async reloadTheirs() {
      try {
        const response = await env.fetch(url, { headers: { accept: "application/json" }, credentials: "same-origin" });
        const body = await readJson(response);
        if (!response.ok || typeof body.revision !== "number" || !body.document || typeof body.document !== "object") {
          actions().setSave({ kind: "refused", message: `Their revision could not be loaded (the server answered ${response.status}). Nothing was changed.` });
          return;
        }
        const checked = validateDraft(body.document);
        actions().replaceDocument(checked.ok ? checked.network : (body.document as Network));
        actions().markSaved(body.revision, store.getState().document, typeof body.foldedSaves === "number" ? body.foldedSaves : undefined);
        markClean();
      } catch {
        actions().setSave({ kind: "offline" });
      }
    },
    stop() {
      stopped = true;
      clearTimeout(timer);
      unsubscribe();
      stopListening();
    },
  };
}
