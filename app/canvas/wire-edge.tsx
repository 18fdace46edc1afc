// A wire. In simulation a wire on an energized net is drawn live (moss, thick). A selected wire
// names its two ends on the canvas.
import { memo } from "react";
import { BaseEdge, EdgeLabelRenderer, getSmoothStepPath, type EdgeProps, type EdgeTypes } from "@xyflow/react";
import { useEditor } from "./store";
import type { CanvasEdge } from "./types";

function WireView({
  id,
  source,
  target,
  sourceHandleId,
  targetHandleId,
  sourceX,
  sourceY,
  targetX,
  targetY,
  sourcePosition,
  targetPosition,
  selected,
}: EdgeProps<CanvasEdge>) {
  const live = useEditor((s) => (s.simView ? s.simView.energized.has(`${source}.${sourceHandleId}`) : null));
  const [path, labelX, labelY] = getSmoothStepPath({ sourceX, sourceY, targetX, targetY, sourcePosition, targetPosition, borderRadius: 6 });
  const stroke = live
    ? "var(--color-moss-600)"
    : selected
      ? "var(--color-copper-500)"
      : live === false
        ? "var(--color-ink-300)"
        : "var(--color-ink-600)";
  return (
    <>
      <BaseEdge
        id={id}
        path={path}
        interactionWidth={16}
        style={{ stroke, strokeWidth: live ? 4 : selected ? 3 : 2 }}
        className={live ? "cp-wire-live" : ""}
      />
      {selected ? (
        <EdgeLabelRenderer>
          <div
            className="nodrag nopan pointer-events-none absolute rounded border border-copper-500 bg-white px-1.5 py-0.5 font-mono text-xs text-ink-800 shadow-sm"
            style={{ transform: `translate(-50%, -120%) translate(${labelX}px, ${labelY}px)` }}
            data-testid="wire-label"
          >
            {source}.{sourceHandleId} – {target}.{targetHandleId}
          </div>
        </EdgeLabelRenderer>
      ) : null}
    </>
  );
}

export const edgeTypes: EdgeTypes = { wire: memo(WireView) } as EdgeTypes;
