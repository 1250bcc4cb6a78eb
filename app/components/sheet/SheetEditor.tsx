// The sheet editor: a workspace that fills its frame. The parts shelf and the side dock
// (Details, Checks, notes) sit beside the drawing and fold away; Results sit under the drawing in
// a panel the planner resizes, so drawing and numbers are seen together. On a phone the parts
// stack: drawing, Checks, Results, Details. One store per editor (see sheetStore.ts); saving,
// drafts and live solving hang off that store.
import "@xyflow/react/dist/style.css";
import "./sheet.css";
import { useCallback, useEffect, useMemo, useRef, useState, type CSSProperties, type ReactNode } from "react";
import { ReactFlowProvider, useReactFlow } from "@xyflow/react";
import type { Network } from "#solver/schema.ts";
import { browserEnvironment, startAutosave, type Autosave } from "./autosave.ts";
import { ChecksPanel } from "./ChecksPanel.tsx";
import { DetailsPanel } from "./DetailsPanel.tsx";
import { clearDrafts, draftToOffer, readDraft, readLayout, type Draft } from "./draftStorage.ts";
import type { EquipmentTypes } from "./EquipmentPicker.tsx";
import { freeSpotNear, GRID_PX, partSize, sheetGeometry, type XY } from "./flowModel.ts";
import { READINGS_MEASURE, useLiveSolve } from "./liveSolve.ts";
import { PartsShelf } from "./PartsShelf.tsx";
import { DEFAULT_RESULTS_SHARE, firstResultsShare, ResultsSplitter } from "./ResultsSplitter.tsx";
import { ResultsTabs } from "./ResultsTabs.tsx";
import { ConflictBanner, DraftBanner, NoticeToast } from "./SheetBanners.tsx";
import { SheetCanvas } from "./SheetCanvas.tsx";
import { elementKindOfPart, type PartKind } from "./sheetEdits.ts";
import { createSheetStore, EDIT_MARK, SheetStoreContext, useSheet, useSheetStoreApi } from "./sheetStore.ts";
import { SheetToolbar } from "./SheetToolbar.tsx";
import { ShortcutHelp } from "./ShortcutHelp.tsx";
import { afterNextPaint, useSheetShortcuts, type ShortcutHandlers } from "./shortcuts.ts";

export interface SheetEditorProps {
  networkId: string | number;
  document: Network;
  revision: number;
  /** Autosaves already folded into that revision: the editing session continues after a reload. */
  foldedSaves?: number;
  /** Viewers: no shelf, no dragging or connecting, Details read only, no saving. */
  readOnly?: boolean;
  /** The team's own equipment types, offered before the built-in ones. */
  library?: EquipmentTypes;
  /** Shown under Checks and inside the editor's providers, so it may read the sheet: review notes. */
  aside?: ReactNode;
  /** Where the results CSV downloads come from (default the network's API); null hides them. */
  resultsCsvBase?: string | null;
  /** The page's own slim header (title and links); given, the editor fills the window. */
  head?: ReactNode;
}

export function SheetEditor({ networkId, document, revision, foldedSaves, readOnly = false, library, aside, resultsCsvBase, head }: SheetEditorProps) {
  const [store] = useState(() => createSheetStore({ networkId: String(networkId), document, revision, foldedSaves, readOnly }));
  return (
    <SheetStoreContext.Provider value={store}>
      <ReactFlowProvider>
        <EditorLayout library={library ?? {}} aside={aside} resultsCsvBase={resultsCsvBase} head={head} />
      </ReactFlowProvider>
    </SheetStoreContext.Provider>
  );
}

/** Below this width the shelf and the dock start folded, so the drawing keeps the room. */
const ROOMY_WIDTH_PX = 1100;
/** Below this width the dock's panels are lists under the drawing (sheet.css), so they stay. */
const PHONE_WIDTH_PX = 768;

/**
 * The sheet's pan and zoom keep the pointer from taking focus, so a Details field would stay
 * focused (and the sheet's keys asleep) after a click on the sheet: leave the field, which
 * commits what was typed.
 */
function commitFieldBeingTyped() {
  const active = document.activeElement;
  if (active instanceof HTMLElement && active.matches("input, select, textarea")) active.blur();
}

const snap = (p: XY): XY => ({ x: Math.round(p.x / GRID_PX) * GRID_PX, y: Math.round(p.y / GRID_PX) * GRID_PX });

function EditorLayout({
  library,
  aside,
  resultsCsvBase,
  head,
}: {
  library: EquipmentTypes;
  aside: ReactNode;
  resultsCsvBase: string | null | undefined;
  head: ReactNode;
}) {
  const store = useSheetStoreApi();
  const readOnly = useSheet((s) => s.readOnly);
  const rootRef = useRef<HTMLDivElement>(null);
  const canvasRef = useRef<HTMLDivElement>(null);
  const saver = useRef<Autosave | null>(null);
  const [draft, setDraft] = useState<Draft | undefined>();
  const { fitView, screenToFlowPosition, zoomIn, zoomOut } = useReactFlow();
  const [shelfOpen, setShelfOpen] = useState(true);
  const [dockOpen, setDockOpen] = useState(true);
  const [resultsShare, setResultsShare] = useState(DEFAULT_RESULTS_SHARE);
  const centreRef = useRef<HTMLDivElement>(null);
  const resultsSharedByHand = useRef(false);

  useLiveSolve(store);

  // Results start with what the drawing can spare of this window, until the planner drags them;
  // the centre's height follows the window and whatever sits above it (a toolbar that wraps).
  useEffect(() => {
    const centre = centreRef.current;
    if (!centre) return;
    const fitResults = () => {
      if (!resultsSharedByHand.current) setResultsShare(firstResultsShare(centre.getBoundingClientRect().height, window.innerHeight));
    };
    fitResults();
    const watcher = new ResizeObserver(fitResults);
    watcher.observe(centre);
    return () => watcher.disconnect();
  }, []);

  useEffect(() => {
    if (window.innerWidth < ROOMY_WIDTH_PX) setShelfOpen(false);
    if (window.innerWidth < ROOMY_WIDTH_PX && window.innerWidth >= PHONE_WIDTH_PX) setDockOpen(false);
  }, []);

  useEffect(() => {
    const env = browserEnvironment();
    const { networkId, savedRevision, document } = store.getState();
    const layout = env.storage ? readLayout(env.storage, networkId) : undefined;
    if (layout) {
      // The stored layout is where this browser left things, not an edit to undo.
      store.temporal.getState().pause();
      store.setState({ layout });
      store.temporal.getState().resume();
    }
    if (store.getState().readOnly) return;
    if (env.storage) setDraft(draftToOffer(readDraft(env.storage, networkId), { revision: savedRevision, document }));
    saver.current = startAutosave(store, env);
    return () => saver.current?.stop();
  }, [store]);

  // Measured after the browser has drawn the new Readings: what the planner waits for. Followed
  // through the store, not a render of the editor: new Readings re-render only what shows them.
  useEffect(() => {
    let frame = 0;
    const unsubscribe = store.subscribe((state, previous) => {
      if (state.solve === previous.solve || state.solve.kind === "pending") return;
      cancelAnimationFrame(frame);
      frame = requestAnimationFrame(() => {
        if (performance.getEntriesByName(EDIT_MARK, "mark").length === 0) return;
        performance.measure(READINGS_MEASURE, EDIT_MARK);
        performance.clearMarks(EDIT_MARK);
      });
    });
    return () => {
      cancelAnimationFrame(frame);
      unsubscribe();
    };
  }, [store]);

  // While a fit moves the view the canvas carries data-view-moving, so that browser tests wait for
  // the view to come to rest instead of sleeping; it goes once the last step has been painted. Set
  // on the element itself: the flag is not worth a render of the whole editor.
  const fitsRunning = useRef(0);
  const fit = useCallback(() => {
    const canvas = canvasRef.current;
    fitsRunning.current++;
    canvas?.setAttribute("data-view-moving", "");
    void fitView({ padding: 0.2, duration: 200, maxZoom: 1.25 }).finally(() =>
      afterNextPaint(() => {
        if (--fitsRunning.current === 0) canvas?.removeAttribute("data-view-moving");
      }),
    );
  }, [fitView]);

  const placeAtCentre = useCallback(
    (part: PartKind) => {
      const rect = canvasRef.current?.getBoundingClientRect();
      if (!rect) return;
      const centre = snap(screenToFlowPosition({ x: rect.left + rect.width / 2, y: rect.top + rect.height / 2 }));
      const { document, layout } = store.getState();
      const kind = elementKindOfPart(part);
      const size = kind === "bus" ? { width: 24, height: 80 } : partSize(kind);
      const at = freeSpotNear(sheetGeometry(document, layout), centre, size);
      store.getState().actions.place(part, at);
    },
    [screenToFlowPosition, store],
  );

  const handlers: ShortcutHandlers = useMemo(
    () => ({
      fit,
      zoom: (direction) => void (direction === "in" ? zoomIn : zoomOut)({ duration: 150 }),
      placeAtCentre,
      nudge: (dx, dy) => {
        const { document, layout, selection, actions } = store.getState();
        const centers = sheetGeometry(document, layout).centers;
        const moves: Record<string, XY> = {};
        for (const id of selection) {
          const c = centers.get(id);
          if (c) moves[id] = { x: c.x + dx, y: c.y + dy };
        }
        if (Object.keys(moves).length) actions.commitMoves(moves);
      },
    }),
    [fit, placeAtCentre, store, zoomIn, zoomOut],
  );
  useSheetShortcuts(store, rootRef, handlers);

  const panels = { shelfOpen, dockOpen, onShelf: () => setShelfOpen(!shelfOpen), onDock: () => setDockOpen(!dockOpen) };
  return (
    <div
      ref={rootRef}
      className={`ks-editor${head ? " ks-editor-full" : ""}${readOnly ? " ks-editor-readonly" : ""}`}
      data-shelf={readOnly || !shelfOpen ? "closed" : "open"}
      data-dock={dockOpen ? "open" : "closed"}
    >
      {head ? <header className="ks-head">{head}</header> : null}
      <SheetToolbar onFit={fit} panels={panels} />
      <ConflictBanner onReloadTheirs={() => void saver.current?.reloadTheirs()} onKeepMine={() => saver.current?.keepMine()} />
      {draft ? (
        <DraftBanner
          draft={draft}
          savedRevision={store.getState().savedRevision}
          onRestore={() => {
            store.getState().actions.replaceDocument(draft.document, draft.layout);
            setDraft(undefined);
          }}
          onDiscard={() => {
            const storage = browserEnvironment().storage;
            if (storage) clearDrafts(storage, store.getState().networkId);
            setDraft(undefined);
          }}
        />
      ) : null}
      <div className="ks-workspace">
        {readOnly || !shelfOpen ? null : <PartsShelf onPlace={placeAtCentre} />}
        <div className="ks-centre" ref={centreRef} style={{ "--ks-results-share": `${resultsShare}%` } as CSSProperties}>
          <div className="ks-canvas" ref={canvasRef} onPointerDownCapture={commitFieldBeingTyped}>
            <SheetCanvas />
            <NoticeToast />
          </div>
          <ResultsSplitter
            share={resultsShare}
            onChange={(share) => {
              resultsSharedByHand.current = true;
              setResultsShare(share);
            }}
          />
          <div className="ks-results-dock">
            <ResultsTabs csvBase={resultsCsvBase} />
          </div>
        </div>
        {dockOpen ? (
          <div className="ks-side" id="ks-dock">
            <div className="ks-dock-details">
              <DetailsPanel library={library} />
            </div>
            <div className="ks-dock-checks">
              <ChecksPanel />
            </div>
            <div className="ks-dock-aside">{aside}</div>
          </div>
        ) : null}
      </div>
      <ShortcutHelp />
    </div>
  );
}
