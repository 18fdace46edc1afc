// A wire. In simulation a wire on an energized net is drawn live (moss, thick).
import { memo } from "react";
import { BaseEdge, getSmoothStepPath, type EdgeProps, type EdgeTypes } from "@xyflow/react";
import { useEditor } from "./store";
import type { CanvasEdge } from "./types";

function WireView({ id, source, sourceHandleId, sourceX, sourceY, targetX, targetY, sourcePosition, targetPosition, selected }: EdgeProps<CanvasEdge>) {
  const live = useEditor((s) => (s.simView ? s.simView.energized.has(`${source}.${sourceHandleId}`) : null));
  const [path] = getSmoothStepPath({ sourceX, sourceY, targetX, targetY, sourcePosition, targetPosition, borderRadius: 6 });
  const stroke = live ? "var(--color-moss-600)" : selected ? "var(--color-copper-500)" : live === false ? "var(--color-ink-300)" : "var(--color-ink-600)";
  return <BaseEdge id={id} path={path} style={{ stroke, strokeWidth: live ? 4 : selected ? 3 : 2 }} className={live ? "cp-wire-live" : ""} />;
}

export const edgeTypes: EdgeTypes = { wire: memo(WireView) } as EdgeTypes;
