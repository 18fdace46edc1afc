// Contact: terminals "1" and "2"; conducts when its condition is in one of `closedIn`.
// Drawn with the open-standard ladder symbols: normally open ("| |") when it is open in the
// condition's first (rest) state, normally closed ("|/|") when it conducts there. In the fault
// view the contact held stuck carries a marker saying how it is stuck.
import { memo } from "react";
import type { NodeProps } from "@xyflow/react";
import { contactSense, type ContactSense } from "../node-kinds";
import { useEditor } from "../store";
import type { ContactNode } from "../types";
import { Position, TerminalHandle } from "./terminal-handle";

export function ContactSymbol({ sense, conducting }: { sense: ContactSense; conducting: boolean | null }) {
  const tone = conducting === null ? "text-ink-800" : conducting ? "text-moss-600" : "text-brick-600";
  return (
    <svg viewBox="0 0 60 24" className={`h-6 w-16 ${tone}`} aria-hidden="true">
      <path d="M0 12h22M38 12h22M22 3v18M38 3v18" stroke="currentColor" strokeWidth="2.2" fill="none" />
      {conducting === null && sense === "normally-closed" ? <path d="M17 22L43 2" stroke="currentColor" strokeWidth="2" /> : null}
      {conducting === true ? <path d="M22 12h16" stroke="currentColor" strokeWidth="4" /> : null}
    </svg>
  );
}

function ContactView({ id, data, selected }: NodeProps<ContactNode>) {
  const condition = useEditor((s) => s.rest.conditions.find((c) => c.id === data.condition));
  const conducting = useEditor((s) => (s.simView ? (s.simView.contacts[id] ?? false) : null));
  const stuck = useEditor((s) => (s.simView?.fault?.component === id ? s.simView.fault.mode : null));
  const connectable = useEditor((s) => !s.readOnly && s.simulation === null);
  const sense = contactSense(data.closedIn, condition?.states);
  const senseText = sense === "normally-closed" ? "NC" : sense === "normally-open" ? "NO" : "?";
  return (
    <div
      data-testid={`node-${id}`}
      data-conducting={conducting === null ? undefined : String(conducting)}
      data-stuck={stuck ?? undefined}
      className={`cp-node relative w-44 rounded-md border-2 bg-white px-3 py-2 ${stuck ? "cp-stuck border-brick-600" : selected ? "border-copper-500" : "border-ink-700"}`}
    >
      {stuck ? (
        <div
          className="absolute -top-3 left-2 rounded bg-brick-600 px-1.5 py-0.5 text-[10px] font-bold uppercase tracking-wide text-white"
          data-testid={`stuck-${id}`}
        >
          Stuck {stuck === "stuck-closed" ? "closed" : "open"}
        </div>
      ) : null}
      <TerminalHandle component={id} terminal="1" position={Position.Left} connectable={connectable} />
      <div className="flex items-baseline justify-between gap-2">
        <span className="min-w-0 truncate text-xs font-semibold text-ink-500">{id}</span>
        <span
          className="rounded border border-ink-300 px-1 text-[10px] font-bold text-ink-600"
          title={sense === "unknown" ? "pick a condition" : sense.replace("-", " ")}
        >
          {senseText}
        </span>
      </div>
      <div className="truncate text-sm font-medium text-ink-900" title={data.label || undefined}>
        {data.label || "Contact"}
      </div>
      <div className="my-1 flex justify-center">
        <ContactSymbol sense={sense} conducting={conducting} />
      </div>
      <div className="truncate text-xs text-ink-600">
        <span className="font-medium">{condition?.label || data.condition || "no condition"}</span>
        {": closed in "}
        <span className="font-semibold text-ink-800">{data.closedIn.length ? data.closedIn.join(" / ") : "—"}</span>
      </div>
      {conducting !== null ? (
        <div className={`mt-1 text-xs font-semibold ${conducting ? "text-moss-700" : "text-brick-700"}`}>
          {conducting ? "closed" : "open"}
          {stuck ? " (held by the fault, whatever the condition)" : ""}
        </div>
      ) : null}
      <TerminalHandle component={id} terminal="2" position={Position.Right} connectable={connectable} />
    </div>
  );
}

export const ContactNodeView = memo(ContactView);
