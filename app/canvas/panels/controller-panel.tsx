// The motor controller: the throttle's condition and the class of each of its states, whether
// braking cuts drive, and the lockouts (each explained in one line).
import type { ThrottleMapping } from "../../engine";
import { LOCKOUTS } from "../../engine/vocabulary";
import { LOCKOUT_TEXT, lockoutTitle } from "../../lib/lockouts";
import { useEditor } from "../store";
import { FieldProblems, Section, Select, problemsUnder, useValidation } from "./common";

const CLASSES = ["released", "applied", "fault"] as const;

export function ControllerPanel() {
  const controller = useEditor((s) => s.rest.controller);
  const conditions = useEditor((s) => s.rest.conditions);
  const editable = useEditor((s) => !s.readOnly && s.simulation === null);
  const updateRest = useEditor((s) => s.updateRest);
  const problems = useValidation();
  const t = controller.throttle;
  const cond = conditions.find((c) => c.id === t.condition);
  const classOf = (st: string) => CLASSES.find((k) => (t[k] ?? []).includes(st)) ?? "";
  const setThrottle = (next: ThrottleMapping) => updateRest((rest) => ({ ...rest, controller: { ...rest.controller, throttle: next } }));
  const lockouts = controller.lockouts ?? [];

  return (
    <div>
      <Section title="Throttle">
        <Select
          label="Throttle condition"
          value={t.condition}
          disabled={!editable}
          invalid={problemsUnder(problems, "controller.throttle.condition").length > 0}
          onChange={(e) => {
            const c = conditions.find((x) => x.id === e.target.value);
            setThrottle({ condition: e.target.value, released: c ? [c.states[0]] : [], applied: c ? c.states.slice(1) : [], fault: [] });
          }}
        >
          {cond ? null : <option value={t.condition}>{t.condition || "(pick a condition)"}</option>}
          {conditions.map((c) => (
            <option key={c.id} value={c.id}>
              {c.label ? `${c.label} (${c.id})` : c.id}
            </option>
          ))}
        </Select>
        {cond ? (
          <table className="w-full text-sm">
            <caption className="sr-only">Class of each throttle state</caption>
            <thead>
              <tr className="text-left text-xs text-ink-500">
                <th className="font-medium">State</th>
                {CLASSES.map((k) => (
                  <th key={k} className="font-medium">
                    {k}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {cond.states.map((st) => (
                <tr key={st}>
                  <td className="py-0.5 font-medium">{st}</td>
                  {CLASSES.map((k) => (
                    <td key={k}>
                      <input
                        type="radio"
                        name={`throttle-${st}`}
                        aria-label={`${st} is ${k}`}
                        checked={classOf(st) === k}
                        disabled={!editable}
                        onChange={() =>
                          setThrottle({
                            ...t,
                            released: (t.released ?? []).filter((x) => x !== st).concat(k === "released" ? [st] : []),
                            applied: (t.applied ?? []).filter((x) => x !== st).concat(k === "applied" ? [st] : []),
                            fault: (t.fault ?? []).filter((x) => x !== st).concat(k === "fault" ? [st] : []),
                          })
                        }
                      />
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        ) : null}
        <FieldProblems problems={problemsUnder(problems, "controller.throttle")} />
      </Section>
      <Section title="Brake">
        <label className="flex items-start gap-2 text-sm">
          <input
            type="checkbox"
            className="mt-1"
            checked={controller.brakeCutsDrive !== false}
            disabled={!editable}
            onChange={(e) => updateRest((rest) => ({ ...rest, controller: { ...rest.controller, brakeCutsDrive: e.target.checked } }))}
          />
          <span>An energized brake input cuts drive</span>
        </label>
      </Section>
      <Section title="Lockouts">
        <p className="text-xs text-ink-500">A lockout holds drive off after its event until the throttle reads released.</p>
        {LOCKOUTS.map((l) => (
          <label key={l} className="flex items-start gap-2 text-sm">
            <input
              type="checkbox"
              className="mt-1"
              checked={lockouts.includes(l)}
              disabled={!editable}
              onChange={(e) =>
                updateRest((rest) => {
                  const cur = rest.controller.lockouts ?? [];
                  const next = e.target.checked ? LOCKOUTS.filter((x) => x === l || cur.includes(x)) : cur.filter((x) => x !== l);
                  return { ...rest, controller: { ...rest.controller, lockouts: next } };
                })
              }
            />
            <span>
              <span className="font-semibold">{lockoutTitle(l)}</span>
              <span className="block text-xs text-ink-600">{LOCKOUT_TEXT[l].line}</span>
            </span>
          </label>
        ))}
        <FieldProblems problems={problemsUnder(problems, "controller").filter((p) => !p.path.startsWith("controller.throttle"))} />
      </Section>
    </div>
  );
}
