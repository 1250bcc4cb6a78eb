// The wire from a terminal to its busbar, drawn along the route flowModel computed; its weight
// and hue are those of the bus's voltage class.
import { memo } from "react";
import { BaseEdge, type EdgeProps } from "@xyflow/react";
import type { WireEdge } from "./flowModel.ts";
import { strokeFor } from "./voltageClasses.ts";

function WireView({ data, selected }: EdgeProps<WireEdge>) {
  if (!data || data.points.length < 2) return null;
  const [first, ...rest] = data.points;
  const path = `M ${first.x} ${first.y} ${rest.map((p) => `L ${p.x} ${p.y}`).join(" ")}`;
  const stroke = strokeFor(data.nominalKV);
  return (
    <BaseEdge
      path={path}
      interactionWidth={14}
      className={selected ? "ks-wire ks-wire-selected" : "ks-wire"}
      style={{ stroke: stroke.colour, strokeWidth: stroke.strokePx, strokeLinecap: "square" }}
    />
  );
}

/** Module level, so xyflow never sees a new object. */
export const edgeTypes = { wire: memo(WireView) };
