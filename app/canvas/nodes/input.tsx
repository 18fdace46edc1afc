// Controller input: one terminal "in"; the function (power, enable, forward, reverse, brake) is a badge.
import { memo } from "react";
import type { NodeProps } from "@xyflow/react";
import { FUNCTION_LABEL } from "../node-kinds";
import { useEditor } from "../store";
import type { InputNode } from "../types";
import { Position, TerminalHandle } from "./terminal-handle";

function InputView({ id, data, selected }: NodeProps<InputNode>) {
  const lit = useEditor((s) => (s.simView ? (s.simView.inputs[id] ?? false) : null));
  const connectable = useEditor((s) => !s.readOnly && s.simulation === null);
  return (
    <div
      data-testid={`node-${id}`}
      data-energized={lit === null ? undefined : String(lit)}
      className={`cp-node flex min-w-32 max-w-56 items-center gap-2 rounded-md border-2 px-3 py-2 ${selected ? "border-copper-500" : "border-ink-700"} ${lit ? "bg-moss-50" : "bg-white"}`}
    >
      <TerminalHandle component={id} terminal="in" position={Position.Left} connectable={connectable} />
      <span
        className={`rounded px-1.5 py-0.5 text-[10px] font-bold uppercase tracking-wide ${lit ? "bg-moss-600 text-white" : "bg-ink-800 text-white"}`}
      >
        {FUNCTION_LABEL[data.function] ?? data.function}
      </span>
      <div className="min-w-0 leading-tight">
        <div className="truncate text-xs font-semibold text-ink-500">{id}</div>
        <div className="truncate text-sm font-medium text-ink-900" title={data.label || undefined}>
          {data.label || "Controller input"}
        </div>
        {lit !== null ? (
          <div className={`text-xs font-semibold ${lit ? "text-moss-700" : "text-ink-500"}`}>{lit ? "energized" : "dead"}</div>
        ) : null}
      </div>
    </div>
  );
}

export const InputNodeView = memo(InputView);
