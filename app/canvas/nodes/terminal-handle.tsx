// One terminal of a component as an xyflow handle. Connection mode is loose (wires have no
// direction in the spec), so every handle is a source and can start or end a wire. A wire is
// drawn by dragging from one terminal to another, or by clicking one and then the other. The
// handle's hit area grows as the view zooms out (canvas.css, --cp-hit), so it stays at least
// 24 px on screen; the dot drawn inside keeps its size.
import { Handle, Position } from "@xyflow/react";
import { useEditor, useEditorStore } from "../store";

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
  const store = useEditorStore();
  const armed = useEditor((s) => s.pendingWire?.component === component && s.pendingWire.terminal === terminal);
  return (
    <Handle
      id={terminal}
      type="source"
      position={position}
      isConnectable={connectable}
      data-testid={`handle-${component}-${terminal}`}
      aria-label={`Terminal ${component}.${terminal}`}
      aria-pressed={armed}
      role="button"
      title={
        connectable ? `${component}.${terminal}: drag to another terminal, or click it and then the other` : `${component}.${terminal}`
      }
      className={`cp-handle ${armed ? "cp-handle-armed" : ""} ${className}`}
      onClick={(e) => {
        if (!connectable) return;
        e.stopPropagation();
        store.getState().clickTerminal({ component, terminal });
      }}
    />
  );
}

export { Position };
