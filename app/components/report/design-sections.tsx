// The report's account of the design itself: its conditions with the contacts each one moves and the
// controller's settings, then its rules in words with the engine's results.
import type { Design, Verdict } from "~/engine";
import { VerdictSummary, type TraceStepView } from "~/components/truth-table/verdict-summary";
import { Table, TBody, Td } from "~/components/ui/table";
import { PaperHead } from "./paper-head";
import { h2 } from "./paper";
import { ruleText } from "./rule-text";

export function ReportConditions({ doc }: { doc: Design }) {
  return (
    <section aria-label="Conditions and contacts">
      <h2 className={h2}>Conditions and contacts</h2>
      <Table look="paper" className="mt-2 w-full">
        <PaperHead columns={["Condition", "States", "Contacts (closed in; part)"]} />
        <TBody divided={false}>
          {doc.conditions.map((cond) => (
            <tr key={cond.id} className="border-t border-ink-200">
              <Td pad="paper">
                {cond.label || cond.id} <code className="text-xs text-ink-500">{cond.id}</code>
              </Td>
              <Td pad="paper">{cond.states.join(", ")}</Td>
              <Td pad="paper">
                {doc.components
                  .filter((k) => k.type === "contact" && k.condition === cond.id)
                  .map((k) =>
                    k.type === "contact" ? (
                      <div key={k.id}>
                        <strong>{k.id}</strong> {k.label && k.label !== k.id ? `${k.label} ` : ""}— closed in {k.closedIn.join(", ")}
                        {k.part ? `; part ${k.part}` : ""}
                      </div>
                    ) : null,
                  )}
              </Td>
            </tr>
          ))}
        </TBody>
      </Table>
      <p className="mt-2 text-xs text-ink-600">
        Controller: throttle on {doc.controller.throttle.condition} (released: {doc.controller.throttle.released.join(", ") || "—"};
        applied: {doc.controller.throttle.applied.join(", ") || "—"}; fault: {(doc.controller.throttle.fault ?? []).join(", ") || "—"});
        brake {doc.controller.brakeCutsDrive === false ? "does not cut" : "cuts"} the drive; lockouts:{" "}
        {(doc.controller.lockouts ?? []).join(", ") || "none"}.
      </p>
    </section>
  );
}

export function ReportRules({
  doc,
  verdict,
  labels,
  traces,
}: {
  doc: Design;
  verdict: Verdict;
  labels: { rules: Record<string, string>; components: Record<string, string> };
  traces: Record<string, TraceStepView[]>;
}) {
  return (
    <section aria-label="Rules and results">
      <h2 className={h2}>Rules</h2>
      <ul className="mt-2 space-y-1">
        {doc.rules.map((r) => (
          <li key={r.id}>
            <strong>{r.id}</strong> {r.label ? `${r.label}: ` : ""}
            {ruleText(r)}
          </li>
        ))}
      </ul>
      <h2 className={h2}>Results, single faults and no restart</h2>
      <div className="mt-2">
        <VerdictSummary verdict={verdict} ruleLabels={labels.rules} componentLabels={labels.components} traces={traces} />
      </div>
    </section>
  );
}
