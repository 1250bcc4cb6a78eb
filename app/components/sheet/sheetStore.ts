// The sheet editor's state: one zustand store per editor, created by a factory and handed down
// through React context (a module-level store would be shared between server requests and
// between two editors on one page). The network document is the source of truth; the xyflow
// nodes and edges are derived from it. zundo records the document and the layout, so every edit
// is one undo step; a drag is held aside while it lasts and committed in one step at the end.
import { withNeededVersion } from "#solver/equipmentRules.ts";
import { createContext, useContext } from "react";
import { createStore, useStore, type StoreApi } from "zustand";
import { temporal, type TemporalState } from "zundo";
import type { Network } from "#solver/schema.ts";
import type { Check, SolveResult } from "#solver/results.ts";
import { documentIssues, type SheetIssue } from "./documentIssues.ts";
import { AS_DRAWN_VIEW, type CaseView, type ShownCase } from "./caseView.ts";
import type { Study } from "#solver/study/results.ts";
import type { BranchEnvelopeRow, BusEnvelopeRow } from "#solver/study/tables.ts";
import { applyMoves, parseWireId, replaceElement, type SheetContent, type SheetLayout, type TerminalId, type XY } from "./flowModel.ts";
import { indexElements, type AnyElement } from "#app/lib/networkElements.ts";
import {
  connectTerminal,
  copyItems,
  deleteItems,
  pasteClipboard,
  placePart,
  type Clipboard,
  type EditResult,
  type PartKind,
} from "./sheetEdits.ts";

export type SaveStatus =
  | { kind: "saved" }
  | { kind: "pending" }
  | { kind: "saving" }
  | { kind: "offline" }
  /** Saved, but not a complete network yet: the server keeps it as a draft with these problems. */
  | { kind: "draft"; problems: SheetIssue[] }
  | { kind: "conflict"; currentRevision: number; message: string }
  | { kind: "refused"; message: string };

export interface Readings {
  result: SolveResult;
  network: Network;
  elapsedMs: number;
  buses: Map<string, SolveResult["loadFlow"]["buses"][number]>;
  branches: Map<string, SolveResult["loadFlow"]["branches"][number]>;
  sources: Map<string, SolveResult["loadFlow"]["sources"][number]>;
  faults: Map<string, NonNullable<SolveResult["faults"]>["buses"][number]>;
  checksByElement: Map<string, Check[]>;
  /** A draft's elements that are not part of the solved network (see solvablePart.ts). */
  leftOut: Set<string>;
  /** Why they are left out: the draft's problems, empty for a complete network. */
  problems: SheetIssue[];
  /** The operating case these readings are of, when the picker shows one rather than the drawing. */
  shownCase?: ShownCase;
}

/** The envelope across every operating case: what the sheet shows when the picker says so. */
export interface EnvelopeReadings {
  network: Network;
  /** The cases' load flows and the envelope, as the study engine gives them. */
  study: Study;
  elapsedMs: number;
  buses: Map<string, BusEnvelopeRow>;
  branches: Map<string, BranchEnvelopeRow>;
  leftOut: Set<string>;
  problems: SheetIssue[];
}

export type SolveState =
  | { kind: "pending" }
  | { kind: "invalid"; issues: SheetIssue[] }
  | { kind: "failed"; message: string }
  | { kind: "solved"; readings: Readings }
  | { kind: "envelope"; envelope: EnvelopeReadings };

export interface SheetInit {
  networkId: string;
  document: Network;
  revision: number;
  /** Autosaves already folded into that revision (see writeRevision on the server). */
  foldedSaves?: number;
  readOnly: boolean;
  layout?: SheetLayout;
}

export interface SheetStoreState extends SheetContent {
  networkId: string;
  readOnly: boolean;
  /** The revision the server last confirmed, and the document it holds. */
  savedRevision: number;
  savedDocument: Network;
  /** What the server said is folded into savedRevision; unknown after taking a conflict's number. */
  savedFoldedSaves: number | undefined;
  selection: string[];
  /** Positions of nodes while they are being dragged; committed at the end of the drag. */
  dragPositions: Record<string, XY> | null;
  clipboard: Clipboard | null;
  showReadings: boolean;
  showFaults: boolean;
  /** Which operating case the Readings and results show (the case picker). */
  caseView: CaseView;
  helpOpen: boolean;
  notice: string | null;
  save: SaveStatus;
  solve: SolveState;
  /** Asks the sheet to bring an element into view (from Checks or Details). */
  focusRequest: { id: string; nonce: number } | null;
  actions: SheetActions;
}

export interface SheetActions {
  edit(change: (content: SheetContent) => EditResult): void;
  place(part: PartKind, at: XY, dropOnBus?: string): string | undefined;
  connect(elementId: string, terminal: TerminalId, busId: string): void;
  updateElement(id: string, element: AnyElement): void;
  updateNetwork(fields: Partial<Pick<Network, "name" | "frequencyHz" | "baseMVA">>): void;
  deleteSelection(): void;
  copySelection(): void;
  paste(): void;
  select(ids: string[]): void;
  selectAll(): void;
  focusElement(id: string): void;
  dragTo(positions: Record<string, XY>): void;
  commitMoves(positions: Record<string, XY>): void;
  /** Lays the chain out left to right; the layout library loads on first use. */
  arrange(): Promise<void>;
  undo(): void;
  redo(): void;
  setShowReadings(show: boolean): void;
  setShowFaults(show: boolean): void;
  setCaseView(view: CaseView): void;
  setHelpOpen(open: boolean): void;
  dismissNotice(): void;
  setSave(save: SaveStatus): void;
  setSolve(solve: SolveState): void;
  markSaved(revision: number, document: Network, foldedSaves?: number): void;
  /** Take a document from elsewhere (theirs after a conflict, or a restored draft) as an undoable edit. */
  replaceDocument(document: Network, layout?: SheetLayout): void;
  setSavedRevision(revision: number, document: Network): void;
}

export type SheetStore = StoreApi<SheetStoreState> & {
  temporal: StoreApi<TemporalState<SheetContent>>;
};

const PASTE_SHIFT: XY = { x: 40, y: 40 };

/** Performance mark at each edit: the bench measures from here to the readings drawn. */
export const EDIT_MARK = "kilostep:sheet-edit";

/** What the server holds for a saved document: complete, or a draft with its problems. */
export function savedState(document: Network): SaveStatus {
  const problems = documentIssues(document);
  return problems.length ? { kind: "draft", problems } : { kind: "saved" };
}

export function createSheetStore(init: SheetInit): SheetStore {
  return createStore<SheetStoreState>()(
    temporal(
      (set, get, api) => {
        // zundo attaches its temporal store before this creator runs.
        const history = () => (api as SheetStore).temporal.getState();
        const apply = (result: EditResult, selection?: string[]) => {
          const state = get();
          if (state.readOnly) return;
          if (result.document === state.document && result.layout === state.layout && !selection) return;
          if (typeof performance !== "undefined") performance.mark(EDIT_MARK);
          set({
            document: result.document,
            layout: result.layout,
            ...(selection ? { selection } : {}),
            ...(result.notice ? { notice: result.notice } : {}),
          });
        };
        const content = (): SheetContent => ({ document: get().document, layout: get().layout });
        const actions: SheetActions = {
          edit: (change) => apply(change(content())),
          place: (part, at, dropOnBus) => {
            if (get().readOnly) return undefined;
            const placed = placePart(content(), part, at, dropOnBus);
            apply(placed, [placed.id]);
            return placed.id;
          },
          connect: (elementId, terminal, busId) => apply(connectTerminal(content(), elementId, terminal, busId)),
          updateElement: (id, element) => {
            const entry = indexElements(get().document).get(id);
            if (!entry) return;
            apply({ document: withNeededVersion(replaceElement(get().document, entry, element)), layout: get().layout });
          },
          updateNetwork: (fields) => apply({ document: { ...get().document, ...fields }, layout: get().layout }),
          deleteSelection: () => {
            const { selection } = get();
            if (selection.length === 0) return;
            apply(deleteItems(content(), selection), []);
          },
          copySelection: () => {
            const clipboard = copyItems(content(), get().selection);
            if (clipboard) set({ clipboard });
          },
          paste: () => {
            const { clipboard } = get();
            if (!clipboard || get().readOnly) return;
            const pasted = pasteClipboard(content(), clipboard, PASTE_SHIFT);
            apply(pasted, pasted.ids);
            // A second paste lands one step further on.
            set({
              clipboard: {
                items: clipboard.items.map((item) => ({
                  ...item,
                  center: { x: item.center.x + PASTE_SHIFT.x, y: item.center.y + PASTE_SHIFT.y },
                })),
              },
            });
          },
          select: (ids) => set({ selection: ids }),
          selectAll: () => set({ selection: [...indexElements(get().document).keys()] }),
          focusElement: (id) => {
            const wire = parseWireId(id);
            const target = wire ? wire.elementId : id;
            set({ selection: [target], focusRequest: { id: target, nonce: (get().focusRequest?.nonce ?? 0) + 1 } });
          },
          dragTo: (positions) => {
            if (get().readOnly) return;
            set({ dragPositions: { ...(get().dragPositions ?? {}), ...positions } });
          },
          commitMoves: (positions) => {
            const moved = applyMoves(content(), { ...(get().dragPositions ?? {}), ...positions });
            set({ dragPositions: null });
            apply(moved);
          },
          arrange: async () => {
            if (get().readOnly) return;
            const { arrangeLeftToRight } = await import("./arrange.ts");
            const { document, caseView, showFaults } = get();
            const caseNames = (document.cases ?? []).map((c) => c.name);
            const envelopeCase = caseView.kind === "envelope" ? caseNames.reduce((a, b) => (b.length > a.length ? b : a), "") : undefined;
            apply(arrangeLeftToRight(content(), { faults: showFaults, envelopeCase }));
          },
          undo: () => {
            if (!get().readOnly) history().undo();
          },
          redo: () => {
            if (!get().readOnly) history().redo();
          },
          setShowReadings: (showReadings) => set({ showReadings }),
          setShowFaults: (showFaults) => set({ showFaults }),
          setCaseView: (caseView) => set({ caseView }),
          setHelpOpen: (helpOpen) => set({ helpOpen }),
          dismissNotice: () => set({ notice: null }),
          setSave: (save) => set({ save }),
          setSolve: (solve) => set({ solve }),
          markSaved: (revision, document, foldedSaves) => set({ savedRevision: revision, savedDocument: document, savedFoldedSaves: foldedSaves }),
          replaceDocument: (document, layout) => apply({ document, layout: layout ?? get().layout }, []),
          setSavedRevision: (revision, document) => set({ savedRevision: revision, savedDocument: document, savedFoldedSaves: undefined }),
        };
        return {
          networkId: init.networkId,
          readOnly: init.readOnly,
          document: init.document,
          layout: init.layout ?? {},
          savedRevision: init.revision,
          savedDocument: init.document,
          savedFoldedSaves: init.foldedSaves,
          selection: [],
          dragPositions: null,
          clipboard: null,
          showReadings: true,
          showFaults: false,
          caseView: AS_DRAWN_VIEW,
          helpOpen: false,
          notice: null,
          save: savedState(init.document),
          solve: { kind: "pending" },
          focusRequest: null,
          actions,
        };
      },
      {
        partialize: (state): SheetContent => ({ document: state.document, layout: state.layout }),
        // Only a new document or layout is an undo step; selection, drags and readings are not.
        equality: (past, current) => past.document === current.document && past.layout === current.layout,
        limit: 200,
      },
    ),
  ) as SheetStore;
}

export const SheetStoreContext = createContext<SheetStore | null>(null);

export function useSheetStoreApi(): SheetStore {
  const store = useContext(SheetStoreContext);
  if (!store) throw new Error("The sheet's parts must sit inside <SheetEditor>.");
  return store;
}

export function useSheet<T>(selector: (state: SheetStoreState) => T): T {
  return useStore(useSheetStoreApi(), selector);
}

export function useSheetActions(): SheetActions {
  return useSheet((s) => s.actions);
}

export function useSheetHistory<T>(selector: (state: TemporalState<SheetContent>) => T): T {
  return useStore(useSheetStoreApi().temporal, selector);
}
