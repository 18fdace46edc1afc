// Junction: a tie point with one terminal "j" where any number of wires meet.
import { memo } from "react";
import type { NodeProps } from "@xyflow/react";
import { useEditor } from "../store";
import type { JunctionNode } from "../types";
import { Position, TerminalHandle } from "./terminal-handle";

function JunctionView({ id, selected }: NodeProps<JunctionNode>) {
  const live = useEditor((s) => s.simView?.energized.has(`${id}.j`) ?? false);
  const connectable = useEditor((s) => !s.readOnly && s.simulation === null);
  return (
    <div data-testid={`node-${id}`} className="cp-node relative h-6 w-6" title={id}>
      <div
        className={`absolute inset-1 rounded-full border-2 ${selected ? "border-copper-500" : "border-ink-700"} ${live ? "bg-moss-600" : "bg-ink-700"}`}
      />
      <TerminalHandle component={id} terminal="j" position={Position.Top} connectable={connectable} className="cp-handle-center" />
    </div>
  );
}

export const JunctionNodeView = memo(JunctionView);
