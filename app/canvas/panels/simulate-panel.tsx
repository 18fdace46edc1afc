// Simulation: set the row by clicking each condition's state, see drive and what blocks it
// (engine diagnose); step through a no-restart counterexample, each step saying what changed,
// where the lockout latch stands and which lockout would have caught the start.
import { useMemo } from "react";
import { diagnose, type Diagnosis } from "../../engine";
import { SafetyNote } from "../../components/safety-note";
import { compiledOf, restRow } from "../simulation";
import { useEditor } from "../store";
import { explainTrace, LOCKOUT_NAME, type TraceExplanation } from "../trace-explain";
import { Section, Small, useDocument } from "./common";
import { Button, Chip } from "../../components/ui/button";

export function SimulatePanel() {
  const simulation = useEditor((s) => s.simulation);
  const simView = useEditor((s) => s.simView);
  const simulate = useEditor((s) => s.simulate);
  const setPanel = useEditor((s) => s.setPanel);
  const readOnly = useEditor((s) => s.readOnly);
  const doc = useDocument();
  const compiled = useMemo(() => compiledOf(doc), [doc]);
  const diagnosis = useMemo((): Diagnosis | string | null => {
    if (!compiled || !simulation) return null;
    try {
      const src = simulation.source;
      if (src.kind === "trace") return diagnose(compiled, src.rows[src.step - 1], { history: src.rows.slice(0, src.step - 1) });
      if (src.kind === "fault") return null;
      return diagnose(compiled, simulation.states);
    } catch (e) {
      return e instanceof Error ? e.message : String(e);
    }
  }, [compiled, simulation]);

  const src0 = simulation?.source;
  const explanation = useMemo(() => (src0?.kind === "trace" ? explainTrace(doc, src0.rows) : null), [doc, src0]);

  if (!compiled) {
    return (
      <Section title="Simulate">
        <p className="text-sm text-ink-600">Fix the problems listed under Problems first: only a valid design can be simulated.</p>
      </Section>
    );
  }
  if (!simulation) {
    return (
      <Section title="Simulate">
        <p className="text-sm text-ink-600">
          Set each condition by hand and watch the wiring: contacts open and close, live wires light up, and the panel says what blocks
          drive.
        </p>
        <Small tone="primary" onClick={() => simulate({ states: restRow(doc), source: { kind: "hand" } })}>
          Start simulating
        </Small>
      </Section>
    );
  }
  const src = simulation.source;
  const states = src.kind === "trace" ? src.rows[src.step - 1] : simulation.states;
  const ruleLabel = (id: string) => doc.rules.find((r) => r.id === id)?.label || id;
  const violatingHere = src.kind === "trace" && explanation !== null && explanation.violatingStep === src.step;

  return (
    <div>
      <Section
        title="Simulating"
        actions={
          <Small
            onClick={() => {
              simulate(null);
              setPanel("properties");
            }}
          >
            {readOnly ? "Stop simulating" : "Back to editing"}
          </Small>
        }
      >
        <p className="text-sm text-ink-700">
          {src.kind === "hand" ? "By hand." : null}
          {src.kind === "row" ? <span data-testid="sim-row">Row {src.index.toLocaleString("en-US")} of the truth table.</span> : null}
          {src.kind === "example"
            ? doc.rules.find((r) => r.id === src.ruleId)?.type === "require-drive"
              ? `“${ruleLabel(src.ruleId)}” says the vehicle must drive in this row, and the drive is off.`
              : `Counterexample of “${ruleLabel(src.ruleId)}”.`
            : null}
          {src.kind === "fault"
            ? `${src.fault.component} ${src.fault.mode.replace("-", " ")} breaks “${ruleLabel(src.ruleId)}” in this row.`
            : null}
          {src.kind === "trace" ? `Steps that break “${ruleLabel(src.ruleId)}”.` : null}
        </p>
        {src.kind === "trace" ? (
          <div className="flex items-center gap-2" role="group" aria-label="Trace steps">
            <Small
              aria-label="Previous step"
              disabled={src.step <= 1}
              onClick={() => simulate({ ...simulation, source: { ...src, step: src.step - 1 } })}
            >
              ◀ Back
            </Small>
            <span className="text-sm font-semibold" data-testid="trace-step">
              Step {src.step} of {src.rows.length}
            </span>
            <Small
              aria-label="Next step"
              disabled={src.step >= src.rows.length}
              onClick={() => simulate({ ...simulation, source: { ...src, step: src.step + 1 } })}
            >
              Forward ▶
            </Small>
          </div>
        ) : null}
        <div
          className={`rounded px-3 py-2 text-sm font-bold ${violatingHere ? "bg-brick-600 text-white" : simView?.drive ? "bg-moss-600 text-white" : "bg-ink-800 text-white"}`}
          data-testid="sim-drive"
          data-violating={violatingHere || undefined}
        >
          Drive {simView?.drive ? "ON" : "OFF"}
          {violatingHere ? <span>: it started on a throttle that was already applied</span> : null}
          {simView?.latched !== undefined ? (
            <span className="ml-2 font-normal">
              · lockout latch {simView.latched ? "set" : "clear"}
              {simView.armed?.length ? ` (armed: ${simView.armed.join(", ")})` : ""}
            </span>
          ) : null}
        </div>
        {simView?.error ? <p className="text-sm text-brick-700">{simView.error}</p> : null}
      </Section>
      {src.kind === "trace" && explanation ? (
        <TraceSteps explanation={explanation} current={src.step} go={(step) => simulate({ ...simulation, source: { ...src, step } })} />
      ) : null}
      <Section title="Conditions">
        {doc.conditions.map((c) => (
          <div key={c.id}>
            <div className="text-xs font-medium text-ink-600">{c.label || c.id}</div>
            <div role="group" aria-label={`State of ${c.label || c.id}`} className="mt-0.5 flex flex-wrap gap-1">
              {c.states.map((st) => (
                <Chip
                  key={st}
                  pressed={states[c.id] === st}
                  onClick={() => simulate({ states: { ...states, [c.id]: st }, source: { kind: "hand" } })}
                >
                  {st}
                </Chip>
              ))}
            </div>
          </div>
        ))}
      </Section>
      {diagnosis && typeof diagnosis === "object" ? (
        <Section title={diagnosis.drive ? "Drive is on" : "What blocks drive"}>
          <ul className="list-disc pl-4 text-sm text-ink-700">
            {diagnosis.reasons.map((r, i) => (
              <li key={i}>{r.message}</li>
            ))}
          </ul>
          {diagnosis.inputs
            .filter((i) => !i.energized)
            .map((i) => (
              <div key={i.input} className="text-xs text-ink-600">
                <span className="font-semibold">{i.label || i.input}</span> is dead
                {i.unreachable
                  ? ": no contacts can bring it to a supply."
                  : i.fixes.length
                    ? `; closing ${i.fixes[0].map((f) => `${f.contact} (${f.condition} in ${f.closeIn.join("/")})`).join(" and ")} would energize it.`
                    : "."}
              </div>
            ))}
        </Section>
      ) : typeof diagnosis === "string" ? (
        <p className="px-3 text-sm text-brick-700">{diagnosis}</p>
      ) : null}
      <div className="p-3">
        <SafetyNote />
      </div>
    </div>
  );
}

/** Every step of a no-restart counterexample: what changed, the latch, and what would have caught it. */
function TraceSteps({ explanation, current, go }: { explanation: TraceExplanation; current: number; go: (step: number) => void }) {
  const { steps, violatingStep, catchers } = explanation;
  return (
    <Section title="Step by step">
      <ol className="space-y-1.5" aria-label="Steps of the counterexample">
        {steps.map((st) => (
          <li key={st.step} data-testid={`trace-step-${st.step}`}>
            <Button
              type="button"
              layout="block"
              variant={st.step === current ? "option-current" : "option"}
              size="option"
              onClick={() => go(st.step)}
              aria-current={st.step === current ? "step" : undefined}
            >
              <div className="flex items-center justify-between gap-2">
                <span className="font-semibold text-ink-800">Step {st.step}</span>
                <span
                  className={`rounded px-1.5 py-0.5 font-bold ${st.restart ? "bg-brick-600 text-white" : st.drive ? "bg-moss-600 text-white" : "bg-ink-200 text-ink-800"}`}
                >
                  drive {st.drive ? "on" : "off"}
                </span>
              </div>
              <p className="mt-0.5 text-ink-700">
                {st.step === 1 ? "From power-up: " : "Changed: "}
                {st.changed.length === 0
                  ? "nothing"
                  : st.changed.map((c) => (st.step === 1 ? `${c.cond} ${c.to}` : `${c.cond} ${c.from} → ${c.to}`)).join(", ")}
                {st.controllerChanges.length ? <span className="text-ink-500"> ({st.controllerChanges.join(", ")})</span> : null}
              </p>
              <p className="text-ink-600">
                {st.latched
                  ? `Latch set${st.armed.length ? ` by the ${st.armed.map((l) => LOCKOUT_NAME[l]).join(" and the ")}` : ""}: drive held off until the throttle is released`
                  : st.armed.length
                    ? `Latch clear: the ${st.armed.map((l) => LOCKOUT_NAME[l]).join(" and the ")} armed here, but ${st.controller.powered ? "the throttle reads released" : "the controller has no power"}`
                    : "Latch clear"}
              </p>
              {st.wouldArm.map((l) => (
                <p key={l} className="text-copper-700">
                  The {LOCKOUT_NAME[l]} is off: with it on, the latch would set here and hold drive off until the throttle is released.
                </p>
              ))}
              {st.restart ? (
                <p className="font-semibold text-brick-700">
                  Drive came on while the throttle was already applied at the step before.{" "}
                  {catchers.length > 0
                    ? `Switching on the ${catchers.map((l) => LOCKOUT_NAME[l]).join(" or the ")} would have kept it off here.`
                    : "No single lockout would have kept it off here: change the wiring or the rule's situation."}
                </p>
              ) : null}
            </Button>
          </li>
        ))}
      </ol>
      {violatingStep === 0 ? (
        <p className="text-xs text-ink-500">These steps no longer start on a held throttle (the design changed since).</p>
      ) : null}
    </Section>
  );
}
