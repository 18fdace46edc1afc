// One terminal of a component as an xyflow handle. Connection mode is loose (wires have no
// direction in the spec), so every handle is a source and can start or end a wire.
import { Handle, Position } from "@xyflow/react";

export function TerminalHandle({
  component,
  terminal,
  position,
  connectable,
  className = "",
}: {
  component: string;
  terminal: string;
  position: Position;
  connectable: boolean;
  className?: string;
}) {
  return (
    <Handle
      id={terminal}
      type="source"
      position={position}
      isConnectable={connectable}
      data-testid={`handle-${component}-${terminal}`}
      aria-label={`Terminal ${component}.${terminal}`}
      title={`${component}.${terminal}`}
      className={`cp-handle ${className}`}
    />
  );
}

export { Position };
