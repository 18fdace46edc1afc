// Supply: always live; one terminal "+". Drawn with Chainproof's own supply mark (a pack with a
// plus), not an earth or ground symbol: a supply here is the live side.
import { memo } from "react";
import type { NodeProps } from "@xyflow/react";
import { useEditor } from "../store";
import type { SupplyNode } from "../types";
import { Position, TerminalHandle } from "./terminal-handle";

export function SupplyMark({ live }: { live: boolean }) {
  return (
    <svg
      viewBox="0 0 24 24"
      className={`h-6 w-6 flex-none ${live ? "text-moss-600" : "text-ink-700"}`}
      data-symbol="supply"
      role="img"
      aria-label="Supply, always live"
    >
      <rect x="2" y="6" width="17" height="12" rx="2.5" fill="none" stroke="currentColor" strokeWidth="2" />
      <path d="M19 10h2.5v4H19" fill="currentColor" stroke="currentColor" strokeWidth="1.5" strokeLinejoin="round" />
      <path d="M6.5 12h8M10.5 8v8" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
    </svg>
  );
}

function SupplyView({ id, data, selected }: NodeProps<SupplyNode>) {
  const simulating = useEditor((s) => s.simView !== null);
  const connectable = useEditor((s) => !s.readOnly && s.simulation === null);
  return (
    <div
      data-testid={`node-${id}`}
      className={`cp-node flex w-44 items-center gap-2 rounded-md border-2 bg-white px-3 py-2 ${selected ? "border-copper-500" : "border-ink-700"} ${simulating ? "cp-live" : ""}`}
    >
      <SupplyMark live={simulating} />
      <div className="min-w-0 leading-tight">
        <div className="truncate text-xs font-semibold text-ink-500">{id}</div>
        <div className="truncate text-sm font-medium text-ink-900" title={data.label || undefined}>
          {data.label || "Supply"}
        </div>
      </div>
      <TerminalHandle component={id} terminal="+" position={Position.Right} connectable={connectable} />
    </div>
  );
}

export const SupplyNodeView = memo(SupplyView);
