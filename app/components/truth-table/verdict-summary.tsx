// A revision's verdict in words: every rule with its unsafe / violating counts, the no-restart
// result with its counterexample, and the single contact faults that defeat a rule.
import type { Verdict } from "~/engine";
import { SingleFaultResults } from "~/components/common-cause-note";
import { Table, TBody, Td, Th, THead } from "~/components/ui/table";

export type TraceStepView = { step: number; states: Record<string, string>; drive: boolean; restart: boolean; armed: string[] };

const ok = (holds: boolean) =>
  holds ? (
    <span className="font-semibold text-moss-700">
      <span aria-hidden="true">✓ </span>holds
    </span>
  ) : (
    <span className="font-semibold text-brick-700">
      <span aria-hidden="true">✕ </span>fails
    </span>
  );

export function VerdictSummary({
  verdict,
  ruleLabels,
  componentLabels,
  traces,
}: {
  verdict: Verdict;
  ruleLabels: Record<string, string>;
  componentLabels: Record<string, string>;
  /** Replayed counterexamples of failing no-restart rules, by rule id. */
  traces: Record<string, TraceStepView[]>;
}) {
  const noRestart = verdict.rules.filter((r) => !("unsafeRows" in r));
  return (
    <div className="space-y-4 text-sm" data-testid="verdict-summary">
      <p>
        <strong>{verdict.ok ? "Every rule holds." : "Some rules fail."}</strong> {verdict.rows.toLocaleString("en-US")} truth-table rows;
        the drive is on in {verdict.driveRows.toLocaleString("en-US")}.
      </p>
      <Table>
        <THead>
          <tr>
            <Th pad="list">Rule</Th>
            <Th pad="list">Unsafe rows</Th>
            <Th pad="list">Violating rows</Th>
            <Th pad="list">Result</Th>
          </tr>
        </THead>
        <TBody>
          {verdict.rules.map((r) => (
            <tr key={r.id}>
              <Td pad="list">
                {ruleLabels[r.id] ?? r.id} <code className="text-xs text-ink-500">{r.id}</code>
              </Td>
              {"unsafeRows" in r ? (
                <>
                  <Td pad="list" className="tabular-nums">
                    {r.unsafeRows.toLocaleString("en-US")}
                  </Td>
                  <Td pad="list" className="tabular-nums">
                    {r.violatingRows.toLocaleString("en-US")}
                  </Td>
                </>
              ) : (
                <Td pad="list" className="text-ink-600" colSpan={2}>
                  no-restart: every sequence of steps
                </Td>
              )}
              <Td pad="list" className="whitespace-nowrap">
                {ok(r.holds)}
              </Td>
            </tr>
          ))}
        </TBody>
      </Table>
      {noRestart.length === 0 ? <p className="text-ink-600">No no-restart rule in this design.</p> : null}
      {noRestart.map((r) =>
        r.holds ? (
          <p key={r.id} className="text-moss-700">
            <span aria-hidden="true">✓ </span>
            No restart: the drive never comes on from a held throttle ({ruleLabels[r.id] ?? r.id}).
          </p>
        ) : (
          <div key={r.id}>
            <p className="text-brick-700">
              <span aria-hidden="true">✕ </span>
              {ruleLabels[r.id] ?? r.id}: the drive can come on from a held throttle. Shortest sequence:
            </p>
            <ol className="mt-1 list-inside list-decimal space-y-0.5">
              {(traces[r.id] ?? []).map((s) => (
                <li key={s.step}>
                  {Object.entries(s.states)
                    .map(([k, v]) => `${k}=${v}`)
                    .join(", ")}{" "}
                  → {s.drive ? "drive" : "no drive"}
                  {s.armed.length > 0 ? ` (lockout armed: ${s.armed.join(", ")})` : ""}
                  {s.restart ? <strong className="text-brick-700"> ← restart</strong> : null}
                </li>
              ))}
            </ol>
          </div>
        ),
      )}
      <SingleFaultResults>
        <h3 className="font-semibold">Single contact faults</h3>
        {verdict.singleFaults.length === 0 ? (
          <p className="mt-1 text-moss-700">
            <span aria-hidden="true">✓ </span>No single stuck contact defeats a rule.
          </p>
        ) : (
          <ul className="mt-1 list-inside list-disc space-y-0.5" aria-label="Single faults">
            {verdict.singleFaults.map((f) => (
              <li key={`${f.component}-${f.mode}`}>
                {componentLabels[f.component] ?? f.component} <code className="text-xs text-ink-500">{f.component}</code>{" "}
                {f.mode === "stuck-closed" ? "stuck closed" : "stuck open"} defeats {f.defeats.map((id) => ruleLabels[id] ?? id).join(", ")}
              </li>
            ))}
          </ul>
        )}
      </SingleFaultResults>
    </div>
  );
}
