// The sheet itself: xyflow drawing the nodes and wires derived from the document, and turning
// the planner's drags, connections and selections back into edits of the store.
import { useCallback, useEffect, useMemo, useRef, type CSSProperties, type DragEvent } from "react";
import {
  Background,
  BackgroundVariant,
  ConnectionLineType,
  ConnectionMode,
  MiniMap,
  Panel,
  ReactFlow,
  useReactFlow,
  useStore as useFlowStore,
  type Connection,
  type EdgeChange,
  type IsValidConnection,
  type NodeChange,
} from "@xyflow/react";
import {
  GRID_PX,
  busAt,
  documentToFlow,
  type SheetNode,
  type SheetNodeData,
  type TerminalId,
  type WireEdge,
  type XY,
} from "./flowModel.ts";
import { nodeTypes } from "./nodes.tsx";
import { VoltageLegend } from "./SheetToolbar.tsx";
import { strokeFor } from "./voltageClasses.ts";
import { partKinds, type PartKind } from "./sheetEdits.ts";
import { useSheet, useSheetActions, useSheetStoreApi } from "./sheetStore.ts";
import { edgeTypes } from "./wires.tsx";

export const PART_DRAG_TYPE = "application/x-kilostep-part";

/**
 * How much the sheet says at each zoom. Close in, every reading; further out, fewer and larger:
 * names and the first line of each reading, their text scaled so that it stays legible on
 * screen; far out, busbars only. The scale is capped so larger text does not swamp the drawing.
 */
const CLOSE_ZOOM = 0.9;
const FAR_ZOOM = 0.4;
const MAX_TEXT_SCALE = 3.2;
/** From this text scale on, each name is cut to its normal-size room (sheet.css), so it cannot reach a neighbour. */
const CUT_TEXT_SCALE = 1.5;

function zoomDetail(zoom: number): { className: string; textScale: number } {
  const textScale = Math.min(MAX_TEXT_SCALE, Math.max(1, 1 / zoom));
  if (zoom >= CLOSE_ZOOM) return { className: "ks-sheet", textScale: 1 };
  const classes = ["ks-sheet", "ks-sheet-mid"];
  if (textScale >= CUT_TEXT_SCALE) classes.push("ks-sheet-cut");
  if (zoom < FAR_ZOOM) classes.push("ks-sheet-far");
  return { className: classes.join(" "), textScale: Math.round(textScale * 20) / 20 };
}

function busColour(node: SheetNode): string {
  return node.type === "bus" ? strokeFor((node.data.element as { nominalKV: number }).nominalKV).colour : "#b9b2a2";
}

const snapToGrid = (p: XY): XY => ({ x: Math.round(p.x / GRID_PX) * GRID_PX, y: Math.round(p.y / GRID_PX) * GRID_PX });

function sameShallow(a: Record<string, unknown>, b: Record<string, unknown>): boolean {
  const keys = Object.keys(a);
  return keys.length === Object.keys(b).length && keys.every((k) => a[k] === b[k]);
}

function sameNodeData(a: SheetNodeData, b: SheetNodeData): boolean {
  return (
    a.element === b.element &&
    a.width === b.width &&
    a.height === b.height &&
    a.bar?.top === b.bar?.top &&
    a.bar?.bottom === b.bar?.bottom &&
    sameShallow(a.sides, b.sides) &&
    sameShallow(a.terminalKV, b.terminalKV)
  );
}

/**
 * Derived nodes are rebuilt on every change; handing xyflow the previous object when nothing in
 * a node changed lets it skip that node entirely, which keeps a 300-element sheet smooth to drag.
 */
function useStableNodes(nodes: SheetNode[]): SheetNode[] {
  const cache = useRef(new Map<string, SheetNode>());
  return useMemo(() => {
    const next = new Map<string, SheetNode>();
    const out = nodes.map((node) => {
      const prev = cache.current.get(node.id);
      const same =
        prev &&
        prev.type === node.type &&
        prev.selected === node.selected &&
        prev.position.x === node.position.x &&
        prev.position.y === node.position.y &&
        prev.ariaLabel === node.ariaLabel &&
        sameNodeData(prev.data, node.data);
      const kept = same ? prev : node;
      next.set(node.id, kept);
      return kept;
    });
    cache.current = next;
    return out;
  }, [nodes]);
}

function useStableEdges(edges: WireEdge[]): WireEdge[] {
  const cache = useRef(new Map<string, WireEdge>());
  return useMemo(() => {
    const next = new Map<string, WireEdge>();
    const out = edges.map((edge) => {
      const prev = cache.current.get(edge.id);
      const same =
        prev &&
        prev.selected === edge.selected &&
        prev.target === edge.target &&
        prev.data!.nominalKV === edge.data!.nominalKV &&
        prev.ariaLabel === edge.ariaLabel &&
        prev.data!.points.length === edge.data!.points.length &&
        prev.data!.points.every((p, i) => p.x === edge.data!.points[i].x && p.y === edge.data!.points[i].y);
      const kept = same ? prev : edge;
      next.set(edge.id, kept);
      return kept;
    });
    cache.current = next;
    return out;
  }, [edges]);
}

/** The busbar and the element terminal of a connection, whichever end the planner started from. */
function terminalAndBus(connection: Connection, kindOf: (id: string) => string | undefined) {
  const ends = [
    { node: connection.source, handle: connection.sourceHandle },
    { node: connection.target, handle: connection.targetHandle },
  ];
  const bus = ends.find((e) => kindOf(e.node) === "bus" && e.handle === "bar");
  const terminal = ends.find((e) => e !== bus && kindOf(e.node) !== "bus" && e.handle);
  if (!bus || !terminal) return undefined;
  return { elementId: terminal.node, terminal: terminal.handle as TerminalId, busId: bus.node };
}

export function SheetCanvas() {
  const store = useSheetStoreApi();
  const actions = useSheetActions();
  const document = useSheet((s) => s.document);
  const layout = useSheet((s) => s.layout);
  const selection = useSheet((s) => s.selection);
  const dragPositions = useSheet((s) => s.dragPositions);
  const readOnly = useSheet((s) => s.readOnly);
  const focusRequest = useSheet((s) => s.focusRequest);
  const { screenToFlowPosition, setCenter, getZoom, fitView } = useReactFlow();
  // The sheet fits the drawing whenever its frame changes size (the page settling, a window
  // resize) until the planner pans or zooms; from then on the view is theirs.
  const paneWidth = useFlowStore((flow) => flow.width);
  const paneHeight = useFlowStore((flow) => flow.height);
  const viewMovedByHand = useRef(false);
  useEffect(() => {
    if (!viewMovedByHand.current && paneWidth > 0 && paneHeight > 0) void fitView({ padding: 0.2, maxZoom: 1.25 });
  }, [paneWidth, paneHeight, fitView]);
  const detail = useFlowStore((flow) => {
    const { className, textScale } = zoomDetail(flow.transform[2]);
    return `${className}|${textScale}`;
  });
  const [sheetClass, textScale] = detail.split("|");

  const flow = useMemo(
    () => documentToFlow(document, layout, { selection: new Set(selection), overrides: dragPositions ?? undefined }),
    [document, layout, selection, dragPositions],
  );
  const nodes = useStableNodes(flow.nodes);
  const edges = useStableEdges(flow.edges);
  const geometryRef = useRef(flow.geometry);
  geometryRef.current = flow.geometry;

  useEffect(() => {
    if (!focusRequest) return;
    const centre = geometryRef.current.centers.get(focusRequest.id);
    if (centre) setCenter(centre.x, centre.y, { zoom: Math.max(getZoom(), 1), duration: 250 });
  }, [focusRequest, setCenter, getZoom]);

  const applySelection = useCallback(
    (changes: { id: string; selected: boolean }[]) => {
      const next = new Set(store.getState().selection);
      for (const change of changes) {
        if (change.selected) next.add(change.id);
        else next.delete(change.id);
      }
      actions.select([...next]);
    },
    [store, actions],
  );

  const onNodesChange = useCallback(
    (changes: NodeChange<SheetNode>[]) => {
      const dragging: Record<string, XY> = {};
      const settled: Record<string, XY> = {};
      let dragEnded = false;
      const selections: { id: string; selected: boolean }[] = [];
      for (const change of changes) {
        if (change.type === "position") {
          if (change.dragging && change.position) dragging[change.id] = change.position;
          else if (change.position) settled[change.id] = change.position;
          else dragEnded = true;
        } else if (change.type === "select") selections.push({ id: change.id, selected: change.selected });
      }
      if (selections.length) applySelection(selections);
      if (readOnly) return;
      if (Object.keys(dragging).length) actions.dragTo(dragging);
      if (Object.keys(settled).length || (dragEnded && store.getState().dragPositions)) actions.commitMoves(settled);
    },
    [actions, applySelection, readOnly, store],
  );

  const onEdgesChange = useCallback(
    (changes: EdgeChange<WireEdge>[]) => {
      const selections = changes.flatMap((c) => (c.type === "select" ? [{ id: c.id, selected: c.selected }] : []));
      if (selections.length) applySelection(selections);
    },
    [applySelection],
  );

  const kindOf = useCallback((id: string) => geometryRef.current.entries.get(id)?.kind, []);

  const isValidConnection: IsValidConnection = useCallback(
    (connection) => terminalAndBus(connection as Connection, kindOf) !== undefined,
    [kindOf],
  );

  const onConnect = useCallback(
    (connection: Connection) => {
      const link = terminalAndBus(connection, kindOf);
      if (link) actions.connect(link.elementId, link.terminal, link.busId);
    },
    [actions, kindOf],
  );

  const onDragOver = useCallback((event: DragEvent) => {
    if (!event.dataTransfer.types.includes(PART_DRAG_TYPE)) return;
    event.preventDefault();
    event.dataTransfer.dropEffect = "copy";
  }, []);

  const onDrop = useCallback(
    (event: DragEvent) => {
      const part = event.dataTransfer.getData(PART_DRAG_TYPE) as PartKind;
      if (!partKinds.includes(part)) return;
      event.preventDefault();
      const at = screenToFlowPosition({ x: event.clientX, y: event.clientY });
      actions.place(part, snapToGrid(at), busAt(geometryRef.current, at, 16));
    },
    [actions, screenToFlowPosition],
  );

  return (
    <ReactFlow<SheetNode, WireEdge>
      nodes={nodes}
      edges={edges}
      nodeTypes={nodeTypes}
      edgeTypes={edgeTypes}
      nodeOrigin={[0.5, 0.5]}
      onNodesChange={onNodesChange}
      onEdgesChange={onEdgesChange}
      onConnect={onConnect}
      isValidConnection={isValidConnection}
      connectionMode={ConnectionMode.Loose}
      connectionLineType={ConnectionLineType.Step}
      connectionRadius={28}
      onDragOver={onDragOver}
      onDrop={onDrop}
      snapToGrid
      snapGrid={[GRID_PX, GRID_PX]}
      nodesDraggable={!readOnly}
      nodesConnectable={!readOnly}
      edgesReconnectable={false}
      deleteKeyCode={null}
      selectionKeyCode="Shift"
      multiSelectionKeyCode={["Shift", "Meta", "Control"]}
      fitView
      fitViewOptions={{ padding: 0.2, maxZoom: 1.25 }}
      minZoom={0.2}
      maxZoom={3}
      attributionPosition="bottom-left"
      onlyRenderVisibleElements
      onMoveStart={(event) => {
        if (event) viewMovedByHand.current = true;
      }}
      className={sheetClass}
      style={{ "--ks-text-scale": textScale } as CSSProperties}
      aria-label="The sheet"
    >
      <MiniMap className="ks-minimap" style={{ width: 150, height: 96 }} pannable zoomable nodeColor={busColour} nodeStrokeWidth={0} ariaLabel="Overview of the drawing" />
      <Panel position="top-left" className="ks-legend-panel">
        <VoltageLegend />
      </Panel>
      <Background id="minor" variant={BackgroundVariant.Lines} gap={GRID_PX} lineWidth={0.5} color="var(--ks-grid-minor)" />
      <Background id="major" variant={BackgroundVariant.Lines} gap={GRID_PX * 5} lineWidth={0.8} color="var(--ks-grid-major)" />
    </ReactFlow>
  );
}
