// Everything that stops the design from being proven: validation problems by field path, every
// failing rule with its counterexample, every single fault that defeats a rule, and the server's
// refusal of a revision. Each counterexample opens in simulation on the canvas.
import type { RuleVerdict, Verdict } from "../../engine";
import { SingleFaultResults } from "../../components/common-cause-note";
import { SafetyNote } from "../../components/safety-note";
import { compiledOf, faultRow } from "../simulation";
import { useEditor, useEditorStore } from "../store";
import { Section, Small, useDocument } from "./common";
import { ProblemList } from "./problem-list";

export { ProblemList };

const statesText = (row: Record<string, string>) =>
  Object.entries(row)
    .map(([k, v]) => `${k} = ${v}`)
    .join(", ");

export function VerdictList({ verdict }: { verdict: Verdict }) {
  const store = useEditorStore();
  const rules = useEditor((s) => s.rest.rules);
  const doc = useDocument();
  const label = (id: string) => rules.find((r) => r.id === id)?.label || id;
  const failing = verdict.rules.filter((r) => !r.holds);
  const show = (r: RuleVerdict) => {
    const s = store.getState();
    if ("trace" in r && r.trace) s.simulate({ states: r.trace[0], source: { kind: "trace", ruleId: r.id, rows: r.trace, step: 1 } });
    else if ("example" in r && r.example) s.simulate({ states: r.example, source: { kind: "example", ruleId: r.id } });
    s.setPanel("simulate");
  };
  return (
    <div className="space-y-2">
      {verdict.driveRows === 0 ? (
        <p className="rounded border border-brick-600/40 bg-white p-2 text-sm font-semibold text-brick-700" data-testid="never-drives">
          The design never drives: no row of its truth table has the drive on, so its inhibit rules prove nothing. Revisions are refused
          until some row drives.
        </p>
      ) : null}
      {failing.length === 0 ? <p className="text-sm text-moss-700">Every rule holds.</p> : null}
      <ul className="space-y-2">
        {failing.map((r) => (
          <li
            key={r.id}
            className="rounded border border-brick-600/40 bg-white p-2 text-sm [overflow-wrap:anywhere]"
            data-testid={`failing-${r.id}`}
          >
            <div className="font-semibold text-brick-700">
              {label(r.id)} <span className="font-normal text-ink-500">({r.id}) fails</span>
            </div>
            {"violatingRows" in r ? (
              <p className="text-xs text-ink-600">
                {r.violatingRows} of {r.unsafeRows} unsafe rows break it. For example: {r.example ? statesText(r.example) : "—"}
              </p>
            ) : null}
            {"failingRows" in r ? (
              <p className="text-xs text-ink-600">
                {r.failingRows} of {r.demandRows} rows where it must drive have the drive off. For example:{" "}
                {r.example ? statesText(r.example) : "—"}
              </p>
            ) : null}
            {"trace" in r && r.trace ? (
              <ol className="ml-4 list-decimal text-xs text-ink-600">
                {r.trace.map((row, i) => (
                  <li key={i}>{statesText(row)}</li>
                ))}
              </ol>
            ) : null}
            <Small className="mt-1" onClick={() => show(r)}>
              {"trace" in r && r.trace ? "Play the steps on the canvas" : "Show this row on the canvas"}
            </Small>
          </li>
        ))}
      </ul>
      {verdict.singleFaults.length === 0 ? (
        <SingleFaultResults>
          <p className="text-sm text-moss-700">No single stuck contact defeats a rule.</p>
        </SingleFaultResults>
      ) : (
        <SingleFaultResults>
          <h4 className="text-xs font-bold uppercase tracking-wide text-ink-500">Single faults that defeat a rule</h4>
          <ul className="mt-1 space-y-1">
            {verdict.singleFaults.map((f) => (
              <li
                key={`${f.component}:${f.mode}`}
                className="rounded border border-copper-500/40 bg-copper-50 px-2 py-1 text-sm text-copper-700"
              >
                <span className="font-semibold">{f.component}</span> {f.mode.replace("-", " ")} defeats {f.defeats.map(label).join(", ")}
                <Small
                  tone="ghost"
                  className="ml-1"
                  onClick={() => {
                    const c = compiledOf(doc);
                    const row = c ? faultRow(c, f.defeats[0], { component: f.component, mode: f.mode }) : null;
                    if (!row) return;
                    store.getState().simulate({
                      states: row,
                      source: { kind: "fault", ruleId: f.defeats[0], fault: { component: f.component, mode: f.mode } },
                    });
                    store.getState().setPanel("simulate");
                  }}
                >
                  Show
                </Small>
              </li>
            ))}
          </ul>
        </SingleFaultResults>
      )}
    </div>
  );
}

export function ProblemsPanel() {
  const proof = useEditor((s) => s.proof);
  const refusal = useEditor((s) => s.refusal);
  const notes = useEditor((s) => s.loadNotes);
  const setRefusal = useEditor((s) => s.setRefusal);
  return (
    <div>
      {refusal ? (
        <Section
          title="Revision refused"
          actions={
            <Small tone="ghost" onClick={() => setRefusal(null)}>
              Dismiss
            </Small>
          }
        >
          {refusal.kind === "problems" ? (
            <>
              <p className="text-sm text-brick-700">The server found problems in the design; nothing was saved.</p>
              <ProblemList problems={refusal.problems} />
            </>
          ) : (
            <>
              <p className="text-sm text-brick-700">
                Not proven: only a design whose every rule holds is saved as a revision. Nothing was saved.
              </p>
              <VerdictList verdict={refusal.verdict} />
            </>
          )}
        </Section>
      ) : null}
      <Section title="Live proof">
        {proof.status === "pending" ? <p className="text-sm text-ink-500">Checking…</p> : null}
        {proof.status === "error" ? <p className="text-sm text-brick-700">The check failed: {proof.message}</p> : null}
        {proof.status === "invalid" ? (
          <>
            <p className="text-sm text-ink-700">The design cannot be proven until these are fixed:</p>
            <ProblemList problems={proof.problems} />
          </>
        ) : null}
        {proof.status === "done" ? <VerdictList verdict={proof.verdict} /> : null}
      </Section>
      {notes.length > 0 ? (
        <Section title="Left out when opening">
          <ul className="text-xs text-ink-600">
            {notes.map((n) => (
              <li key={n}>{n}</li>
            ))}
          </ul>
        </Section>
      ) : null}
      <div className="p-3">
        <SafetyNote />
      </div>
    </div>
  );
}
