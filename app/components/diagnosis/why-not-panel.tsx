// The phone page of "Why won't it drive?": tap each condition's state, see at once whether the drive
// should run and, when not, what to check in order; optionally enter live/dead meter readings of the
// controller inputs and see which stuck contact would explain them. Runs the engine in the browser.
import { useMemo, useState } from "react";
import { compileDesign, type CompiledDesign, type Design } from "~/engine";
import {
  explainMeasured,
  restingStates,
  whyNot,
  type Blocker,
  type ChangeAdvice,
  type ContactCheck,
  type WireEnd,
} from "~/vehicles/why-not";
import { WiringDiagram } from "~/components/wiring-diagram";
import { Button, Chip } from "~/components/ui/button";
import { Card } from "~/components/ui/card";

const MAX_HISTORY = 1000;

type Reading = "unmeasured" | "live" | "dead";

const FUNCTION_WORDS: Record<string, string> = { power: "power", enable: "enable", forward: "forward", reverse: "reverse", brake: "brake" };

function Terminals({ ends }: { ends: WireEnd[] }) {
  return (
    <ul className="mt-1 space-y-0.5 text-base text-ink-600">
      {ends.map((e) => (
        <li key={e.terminal}>
          <span className="font-mono font-semibold text-ink-800">{e.terminal}</span>
          {e.to.length ? <> wired to {e.to.join(", ")}</> : <> not wired</>}
        </li>
      ))}
    </ul>
  );
}

function ContactLine({ k }: { k: ContactCheck }) {
  return (
    <div data-testid="contact-check" data-contact={k.contact}>
      <p className="font-medium">
        <span className="font-mono">{k.contact}</span> {k.label !== k.contact ? <span>· {k.label}</span> : null}
      </p>
      <p className="text-base text-ink-700">
        {k.want === "close" ? "Open now; it closes" : "Closed now; it opens"} when {k.conditionLabel} is {k.targetStates.join(" or ")} (now{" "}
        {k.state}).
        {k.part ? <span className="text-ink-500"> Part: {k.part}.</span> : null}
      </p>
      <Terminals ends={k.terminals} />
    </div>
  );
}

type Apply = (steps: Array<Record<string, string>>) => void;

const listWords = (xs: string[]) => (xs.length <= 1 ? xs.join("") : `${xs.slice(0, -1).join(", ")} and ${xs[xs.length - 1]}`);

/** The smallest change of conditions (each way of making it, with a button that makes it), or why there is none. */
export function ChangeAdviceView({
  advice,
  what,
  throttleLabel,
  onApply,
}: {
  advice: ChangeAdvice;
  what: string;
  throttleLabel: string;
  onApply: Apply;
}) {
  if (advice.kind === "none") {
    return (
      <p className="mt-2 rounded-md bg-brick-50 px-3 py-2 text-base text-brick-700" data-testid="change-none">
        No setting of the conditions {what}: only a wiring fault explains it (the vehicle is not wired as the released drawing shows, or a
        part has failed). Isolate the traction pack before you open the wiring.
      </p>
    );
  }
  const shown = advice.options.filter((o) => o.steps.length > 0);
  if (shown.length === 0) return null;
  return (
    <div className="mt-2" data-testid="change" data-size={advice.size}>
      <p className="text-base font-medium text-ink-800">
        {advice.size === 0
          ? "No condition needs to change:"
          : advice.size === 1
            ? "The smallest change: one condition"
            : `The smallest change: ${advice.size} conditions together`}
        {shown.length > 1 ? ` (${advice.count} ways${advice.count > shown.length ? `, the first ${shown.length} shown` : ""})` : ""}
      </p>
      <ul className="mt-2 space-y-2">
        {shown.map((o, i) => {
          const words = o.changes.map((ch) => `set ${ch.conditionLabel} from ${ch.from} to ${ch.to}`);
          const sentence = words.length > 0 ? `${words[0][0].toUpperCase()}${listWords(words).slice(1)}.` : "";
          return (
            <li
              key={i}
              className="flex flex-wrap items-center gap-x-3 gap-y-2 rounded-md border border-ink-200 bg-ink-50 p-3"
              data-testid="change-option"
            >
              <span className="min-w-0 flex-1 text-base">
                {sentence}
                {o.cycleThrottle
                  ? ` ${sentence ? "Then a" : "A"} lockout holds the drive off: return ${throttleLabel} to rest and apply it again.`
                  : ""}
                {o.heldOff
                  ? " Even so a lockout latches again each time the throttle is applied here: the design's lockouts hold the drive off in these conditions."
                  : ""}
              </span>
              <Button type="button" variant="secondary" size="touch-base" onClick={() => onApply(o.steps)}>
                Make this change
              </Button>
            </li>
          );
        })}
      </ul>
    </div>
  );
}

const GOAL_WORDS: Partial<Record<Blocker["code"], string>> = {
  unpowered: "brings the power input live",
  "not-enabled": "brings the enable input live",
  neutral: "selects a direction",
  "direction-conflict": "leaves exactly one direction live",
  braking: "takes the brake input dead",
  "throttle-released": "applies the throttle",
  "throttle-fault": "brings the throttle out of its fault reading",
};

function BlockerCard({ b, n, throttleLabel, onApply }: { b: Blocker; n: number; throttleLabel: string; onApply: Apply }) {
  return (
    <Card as="li" data-testid="blocker" data-code={b.code}>
      <h3 className="font-semibold">
        <span className="mr-2 inline-flex h-7 w-7 items-center justify-center rounded-full bg-brick-600 text-base text-white">{n}</span>
        {b.title}
      </h3>
      <p className="mt-1 text-base text-ink-700">{b.advice}</p>
      {b.change ? (
        <ChangeAdviceView advice={b.change} what={GOAL_WORDS[b.code] ?? "clears this"} throttleLabel={throttleLabel} onApply={onApply} />
      ) : null}
      {b.contactSets.length > 0 ? <p className="mt-3 text-base font-medium text-ink-800">Where to measure:</p> : null}
      {b.unreachable ? (
        <p className="mt-2 text-base text-brick-700">
          No contact change can bring this input live: it is not wired towards a supply. Check the drawing against the vehicle.
        </p>
      ) : null}
      {b.contactSets.length > 0 ? (
        <ul className="mt-3 space-y-3">
          {b.contactSets.map((set, i) => (
            <li key={i} className="rounded-md border border-ink-200 bg-ink-50 p-3">
              {set.length > 1 ? (
                <p className="mb-2 text-base font-semibold text-brick-700">These {set.length} contacts must all change together:</p>
              ) : null}
              <div className="space-y-3">
                {set.map((k) => (
                  <ContactLine key={k.contact} k={k} />
                ))}
              </div>
              {i < b.contactSets.length - 1 ? <p className="mt-2 text-base font-semibold uppercase text-ink-500">or</p> : null}
            </li>
          ))}
        </ul>
      ) : null}
      {b.truncated ? <p className="mt-2 text-base text-ink-500">Only the first of many ways are listed.</p> : null}
    </Card>
  );
}

export function WhyNotPanel({ document, vehicleName }: { document: Design; vehicleName: string }) {
  const compiled = useMemo<CompiledDesign | null>(() => {
    try {
      return compileDesign(document);
    } catch {
      return null;
    }
  }, [document]);
  if (!compiled) {
    return <p className="text-brick-700">The released revision cannot be read by this version of the engine. Ask the design's engineer.</p>;
  }
  return <Panel c={compiled} vehicleName={vehicleName} />;
}

function Panel({ c, vehicleName }: { c: CompiledDesign; vehicleName: string }) {
  const [states, setStates] = useState<Record<string, string>>(() => restingStates(c));
  const [history, setHistory] = useState<Array<Record<string, string>>>([]);
  const [inOrder, setInOrder] = useState(true);
  const [readings, setReadings] = useState<Record<string, Reading>>({});

  const set = (cond: string, state: string) => {
    if (states[cond] === state) return;
    setHistory((h) => [...h, states].slice(-MAX_HISTORY));
    setStates({ ...states, [cond]: state });
  };
  const apply: Apply = (steps) => {
    if (steps.length === 0) return;
    setHistory((h) => [...h, states, ...steps.slice(0, -1)].slice(-MAX_HISTORY));
    setStates(steps[steps.length - 1]);
  };
  const throttleLabel = c.conditions[c.throttle.cond].label;
  const restart = () => {
    setHistory([]);
    setStates(restingStates(c));
  };

  const result = useMemo(() => whyNot(c, states, inOrder ? history : undefined), [c, states, history, inOrder]);
  const measured = useMemo(() => {
    const m: Record<string, boolean> = {};
    for (const [id, r] of Object.entries(readings)) if (r !== "unmeasured") m[id] = r === "live";
    return m;
  }, [readings]);
  const readingsVerdict = useMemo(() => explainMeasured(c, states, measured), [c, states, measured]);
  const faulty = readingsVerdict.kind === "faults" || readingsVerdict.kind === "unexplained";

  const highlight = result.blockers.flatMap((b) => b.contactSets.flat().map((k) => k.contact));
  const suspects = readingsVerdict.kind === "faults" ? readingsVerdict.suspects.map((s) => s.contact) : [];
  const inputLabel = (id: string) => {
    const x = c.inputs[c.inputIndex[id]];
    return x.label !== x.id ? `${x.label} (${x.id})` : x.id;
  };

  return (
    <div className="space-y-6">
      {/* The verdict follows the readings: a reading the fault-free design cannot give is a fault, whatever the design says. */}
      <div
        role="status"
        aria-live="polite"
        data-testid="verdict"
        data-drive={faulty ? "fault" : result.drive ? "yes" : "no"}
        className={`sticky top-0 z-10 rounded-lg px-4 py-2 text-base font-semibold shadow-sm md:top-2 ${faulty ? "bg-brick-700 text-white" : result.drive ? "bg-moss-600 text-white" : "bg-brick-600 text-white"}`}
      >
        {faulty
          ? `Readings show a fault: ${readingsVerdict.mismatched.map((id) => id).join(", ")} ${readingsVerdict.mismatched.length > 1 ? "read" : "reads"} wrong`
          : result.drive
            ? "Drive should run"
            : `Drive should not run${result.blockers.length > 0 ? ` · ${result.blockers.length === 1 ? "1 thing blocks it" : `${result.blockers.length} things block it`}` : ""}`}
      </div>
      {faulty ? (
        <p className="text-base text-ink-700">
          The design says drive {result.drive ? "should run" : "should not run"} in these conditions, but the meter readings below cannot
          happen in the design as drawn: see what explains them.
        </p>
      ) : result.drive ? (
        <p className="text-base text-ink-700">With these conditions the design lets {vehicleName} drive.</p>
      ) : result.blockers.length > 0 ? (
        <p className="text-base text-ink-700">Check what blocks it in the order below.</p>
      ) : null}

      <section aria-labelledby="conditions-h">
        <h2 id="conditions-h" className="text-lg font-semibold">
          Set each condition as it is on the vehicle
        </h2>
        <div className="mt-3 space-y-4">
          {c.conditions.map((k) => (
            <fieldset key={k.id} data-condition={k.id}>
              <legend className="text-base font-medium text-ink-700">{k.label}</legend>
              <div className="mt-1 flex flex-wrap gap-2">
                {k.states.map((s) => {
                  const on = states[k.id] === s;
                  return (
                    <Chip key={s} pressed={on} size="touch" onClick={() => set(k.id, s)}>
                      {s}
                    </Chip>
                  );
                })}
              </div>
            </fieldset>
          ))}
        </div>
        <div className="mt-4 flex flex-wrap items-center gap-3">
          <label className="flex min-h-11 items-center gap-2 text-base">
            <input type="checkbox" className="h-5 w-5" checked={inOrder} onChange={(e) => setInOrder(e.target.checked)} />
            Follow my taps in order, so lockouts latch as on the vehicle
          </label>
          <Button type="button" variant="secondary" size="touch-base" onClick={restart}>
            Start over from switched off
          </Button>
        </div>
      </section>

      {result.blockers.length > 0 ? (
        <section aria-labelledby="blockers-h" className="scroll-mt-16">
          <h2 id="blockers-h" className="text-lg font-semibold">
            What blocks the drive, in the order to check
          </h2>
          <div className="mt-3 scroll-mt-16 rounded-lg border-2 border-copper-600 bg-white p-4" data-testid="restore">
            <h3 className="font-semibold">To bring the drive back</h3>
            <ChangeAdviceView advice={result.restore} what="lets this design drive" throttleLabel={throttleLabel} onApply={apply} />
          </div>
          <ol className="mt-3 space-y-3">
            {result.blockers.map((b, i) => (
              <BlockerCard key={b.code} b={b} n={i + 1} throttleLabel={throttleLabel} onApply={apply} />
            ))}
          </ol>
        </section>
      ) : null}

      <WiringDiagram
        design={c.design}
        row={result.row}
        highlight={highlight}
        suspects={suspects}
        title={`Wiring of ${vehicleName} in the present conditions`}
        phone
      />

      <Card as="section" aria-labelledby="measured-h" className="scroll-mt-16">
        <h2 id="measured-h" className="text-lg font-semibold">
          Measured mode
        </h2>
        <p className="mt-1 text-base text-ink-600">
          With the conditions above set on the vehicle, enter what the meter reads at each controller input. Leave an input unmeasured if
          you have not checked it.
        </p>
        <div className="mt-3 space-y-3">
          {c.inputs.map((x) => {
            const r = readings[x.id] ?? "unmeasured";
            return (
              <fieldset key={x.id} data-input={x.id}>
                <legend className="text-base font-medium text-ink-700">
                  {inputLabel(x.id)} · {FUNCTION_WORDS[x.fn]} input · design says {result.row.inputs[x.id] ? "live" : "dead"}
                </legend>
                <div className="mt-1 grid grid-cols-3 gap-2">
                  {(["unmeasured", "live", "dead"] as const).map((v) => (
                    <Chip
                      key={v}
                      pressed={r === v}
                      tone="ink"
                      size="touch-sm"
                      aria-label={`${x.id} ${v === "unmeasured" ? "not measured" : `reads ${v}`}`}
                      onClick={() => setReadings({ ...readings, [x.id]: v })}
                    >
                      {v === "unmeasured" ? "Not measured" : v === "live" ? "Reads live" : "Reads dead"}
                    </Chip>
                  ))}
                </div>
              </fieldset>
            );
          })}
        </div>
        <div className="mt-4 scroll-mt-16" data-testid="readings-verdict" data-kind={readingsVerdict.kind}>
          {readingsVerdict.kind === "consistent" ? (
            <p className="rounded-md bg-moss-50 px-3 py-2 text-base text-moss-700">
              The readings match the design in these conditions: the wiring behaves as drawn.
            </p>
          ) : null}
          {readingsVerdict.kind === "unexplained" ? (
            <p className="rounded-md bg-brick-50 px-3 py-2 text-base text-brick-700">
              {readingsVerdict.mismatched.map(inputLabel).join(", ")} {readingsVerdict.mismatched.length > 1 ? "do" : "does"} not read as
              the design says, and no single stuck contact explains it. Look for a broken or misrouted wire, a short between lines, or more
              than one fault.
            </p>
          ) : null}
          {readingsVerdict.kind === "faults" ? (
            <div>
              <p className="rounded-md bg-brick-50 px-3 py-2 text-base text-brick-700">
                {readingsVerdict.mismatched.map(inputLabel).join(", ")} cannot read like this in the fault-free design. Contacts that would
                explain it, most likely first:
              </p>
              <ol className="mt-3 space-y-3">
                {readingsVerdict.suspects.map((s) => (
                  <li
                    key={`${s.contact}-${s.mode}`}
                    className="rounded-md border border-ink-200 p-3"
                    data-testid="suspect"
                    data-contact={s.contact}
                    data-mode={s.mode}
                  >
                    <p className="font-medium">
                      <span className="font-mono">{s.contact}</span> {s.label !== s.contact ? <>· {s.label}</> : null} may be{" "}
                      <strong>{s.mode === "stuck-closed" ? "stuck closed" : "stuck open"}</strong>
                    </p>
                    <p className="text-base text-ink-700">{s.check}</p>
                    {s.otherInputsChanged.length > 0 ? (
                      <p className="mt-1 text-base text-ink-600">
                        It would also change {s.otherInputsChanged.map(inputLabel).join(", ")}: measure{" "}
                        {s.otherInputsChanged.length > 1 ? "them" : "it"} to tell.
                      </p>
                    ) : null}
                    <Terminals ends={s.terminals} />
                  </li>
                ))}
              </ol>
            </div>
          ) : null}
        </div>
      </Card>
    </div>
  );
}
