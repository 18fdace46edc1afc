// Supply: always live; one terminal "+".
import { memo } from "react";
import type { NodeProps } from "@xyflow/react";
import { TERMINALS } from "../../engine";
import { useEditor } from "../store";
import type { SupplyNode } from "../types";
import { Position, TerminalHandle } from "./terminal-handle";

function SupplyView({ id, data, selected }: NodeProps<SupplyNode>) {
  const simulating = useEditor((s) => s.simView !== null);
  const connectable = useEditor((s) => !s.readOnly && s.simulation === null);
  return (
    <div
      data-testid={`node-${id}`}
      className={`cp-node flex w-44 items-center gap-2 rounded-md border-2 bg-white px-3 py-2 ${selected ? "border-copper-500" : "border-ink-700"} ${simulating ? "cp-live" : ""}`}
    >
      <svg viewBox="0 0 24 24" className="h-6 w-6 flex-none" aria-hidden="true">
        <path d="M4 9h16M7 14h10M10 19h4" stroke="currentColor" strokeWidth="2" strokeLinecap="round" className={simulating ? "text-moss-600" : "text-ink-700"} />
        <path d="M12 2v7" stroke="currentColor" strokeWidth="2" className={simulating ? "text-moss-600" : "text-ink-700"} />
      </svg>
      <div className="min-w-0 leading-tight">
        <div className="text-xs font-semibold text-ink-500">{id}</div>
        <div className="truncate text-sm font-medium text-ink-900" title={data.label || undefined}>{data.label || "Supply"}</div>
      </div>
      <TerminalHandle component={id} terminal="+" position={Position.Right} connectable={connectable} />
    </div>
  );
}

export const supplyKind = {
  kind: "supply" as const,
  title: "Supply",
  description: "Always-live source (+)",
  terminals: TERMINALS.supply,
  defaultData: () => ({ label: "Supply +" }),
  component: memo(SupplyView),
};
