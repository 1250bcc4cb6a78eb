// "Arrange": lay the chain out left to right, in the direction power flows from the slack source,
// with dagre; positions snap to the sheet grid.
import dagre from "@dagrejs/dagre";
import {
  GRID_PX,
  anchorOf,
  busCenterMap,
  partSize,
  sheetGeometry,
  terminalBus,
  terminalsOf,
  type SheetContent,
  type SheetLayout,
  type XY,
} from "./flowModel.ts";
import { distanceFromSlack } from "#solver/topology.ts";

const snap = (v: number) => Math.round(v / GRID_PX) * GRID_PX;

export function arrangeLeftToRight(content: SheetContent): SheetContent {
  const geometry = sheetGeometry(content.document, content.layout);
  const graph = new dagre.graphlib.Graph();
  graph.setGraph({ rankdir: "LR", nodesep: 50, ranksep: 56, marginx: 0, marginy: 0 });
  graph.setDefaultEdgeLabel(() => ({}));
  const wiresPerBus = new Map<string, number>();
  for (const wire of geometry.wires) wiresPerBus.set(wire.busId, (wiresPerBus.get(wire.busId) ?? 0) + 1);
  for (const [id, entry] of geometry.entries) {
    if (entry.kind === "bus") graph.setNode(id, { width: 24, height: Math.max(80, 40 * (wiresPerBus.get(id) ?? 0)) });
    else graph.setNode(id, { ...partSize(entry.kind), width: partSize(entry.kind).width + 40 });
  }
  const distance = distanceFromSlack(content.document);
  for (const [id, entry] of geometry.entries) {
    if (entry.kind === "bus") continue;
    const buses = terminalsOf(entry.kind)
      .map((t) => terminalBus(entry, t))
      .filter((b) => geometry.busCenters.has(b));
    if (entry.kind === "source") buses.forEach((b) => graph.setEdge(id, b));
    else if (entry.kind === "load" || entry.kind === "shunt") buses.forEach((b) => graph.setEdge(b, id));
    else {
      const [near, far] = [...buses].sort((a, b) => (distance.get(a) ?? 0) - (distance.get(b) ?? 0));
      if (near) graph.setEdge(near, id);
      if (far) graph.setEdge(id, far);
    }
  }
  dagre.layout(graph);

  const centre = (id: string): XY => {
    const node = graph.node(id);
    return { x: snap(node.x), y: snap(node.y) };
  };
  const document = {
    ...content.document,
    buses: content.document.buses.map((b) => ({ ...b, ...centre(b.id) })),
  };
  const busCenters = busCenterMap(document);
  const layout: SheetLayout = {};
  for (const [id, entry] of geometry.entries) {
    if (entry.kind === "bus") continue;
    const anchor = anchorOf(entry, busCenters);
    const at = centre(id);
    layout[id] = { x: at.x - anchor.x, y: at.y - anchor.y };
  }
  return { document, layout };
}
