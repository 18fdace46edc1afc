// Contact: terminals "1" and "2"; conducts when its condition is in one of `closedIn`.
// Drawn with the open-standard ladder symbols: normally open ("| |") when it is open in the
// condition's first (rest) state, normally closed ("|/|") when it conducts there.
import { memo } from "react";
import type { NodeProps } from "@xyflow/react";
import { TERMINALS } from "../../engine";
import { useEditor } from "../store";
import type { ContactNode, DesignRest } from "../types";
import { Position, TerminalHandle } from "./terminal-handle";

export type ContactSense = "normally-open" | "normally-closed" | "unknown";

/** NO or NC, from whether the contact conducts in the first (rest) state of its condition. */
export function contactSense(closedIn: readonly string[], states: readonly string[] | undefined): ContactSense {
  if (!states || states.length === 0) return "unknown";
  return closedIn.includes(states[0]) ? "normally-closed" : "normally-open";
}

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
  const connectable = useEditor((s) => !s.readOnly && s.simulation === null);
  const sense = contactSense(data.closedIn, condition?.states);
  const senseText = sense === "normally-closed" ? "NC" : sense === "normally-open" ? "NO" : "?";
  return (
    <div
      data-testid={`node-${id}`}
      data-conducting={conducting === null ? undefined : String(conducting)}
      className={`cp-node w-44 rounded-md border-2 bg-white px-3 py-2 ${selected ? "border-copper-500" : "border-ink-700"}`}
    >
      <TerminalHandle component={id} terminal="1" position={Position.Left} connectable={connectable} />
      <div className="flex items-baseline justify-between gap-2">
        <span className="text-xs font-semibold text-ink-500">{id}</span>
        <span
          className="rounded border border-ink-300 px-1 text-[10px] font-bold text-ink-600"
          title={sense === "unknown" ? "pick a condition" : sense.replace("-", " ")}
        >
          {senseText}
        </span>
      </div>
      <div className="truncate text-sm font-medium text-ink-900" title={data.label || undefined}>{data.label || "Contact"}</div>
      <div className="my-1 flex justify-center">
        <ContactSymbol sense={sense} conducting={conducting} />
      </div>
      <div className="text-xs text-ink-600">
        <span className="font-medium">{condition?.label || data.condition || "no condition"}</span>
        {": closed in "}
        <span className="font-semibold text-ink-800">{data.closedIn.length ? data.closedIn.join(" / ") : "—"}</span>
      </div>
      {conducting !== null ? (
        <div className={`mt-1 text-xs font-semibold ${conducting ? "text-moss-700" : "text-brick-700"}`}>{conducting ? "closed" : "open"}</div>
      ) : null}
      <TerminalHandle component={id} terminal="2" position={Position.Right} connectable={connectable} />
    </div>
  );
}

export const contactKind = {
  kind: "contact" as const,
  title: "Contact",
  description: "Switch contact on a condition",
  terminals: TERMINALS.contact,
  defaultData: ({ rest }: { rest: DesignRest }) => {
    // The first condition that is not the throttle, closing in its second state (normally open).
    const c = rest.conditions.find((x) => x.id !== rest.controller.throttle.condition) ?? rest.conditions[0];
    return { label: "Contact", condition: c?.id ?? "", closedIn: c ? [c.states[1] ?? c.states[0]].filter(Boolean) : [] };
  },
  component: memo(ContactView),
};
