// Conditions (the truth table's inputs) and their states; renames keep every reference.
import { useState } from "react";
import { changeStateIn, renameConditionIn } from "../rest-ops";
import { useEditor } from "../store";
import { FieldProblems, Section, Small, Text, problemsUnder, useValidation } from "./common";

export function ConditionsPanel() {
  const conditions = useEditor((s) => s.rest.conditions);
  const editable = useEditor((s) => !s.readOnly && s.simulation === null);
  const updateRest = useEditor((s) => s.updateRest);
  const updateDesign = useEditor((s) => s.updateDesign);
  const problems = useValidation();
  const [newState, setNewState] = useState<Record<number, string>>({});

  const addCondition = () =>
    updateRest((rest) => {
      let n = rest.conditions.length + 1;
      while (rest.conditions.some((c) => c.id === `c${n}`)) n++;
      return { ...rest, conditions: [...rest.conditions, { id: `c${n}`, label: "", states: ["off", "on"] }] };
    });

  return (
    <div>
      <Section title="Conditions" actions={<Small tone="primary" disabled={!editable} onClick={addCondition}>+ Condition</Small>}>
        <FieldProblems problems={problems.filter((p) => p.path === "conditions")} />
        <p className="text-xs text-ink-500">The first state of each condition is its rest state; contacts that conduct there are drawn normally closed.</p>
        {conditions.map((c, i) => {
          const here = problemsUnder(problems, `conditions[${i}]`);
          return (
            <fieldset key={i} className="space-y-2 rounded border border-ink-200 bg-white p-2" aria-label={`Condition ${c.id}`} data-testid={`condition-${c.id}`}>
              <div className="grid grid-cols-[7rem_1fr] gap-2">
                <Text
                  label="Id"
                  value={c.id}
                  disabled={!editable}
                  invalid={here.some((p) => p.path === `conditions[${i}].id`)}
                  onChange={(e) => updateDesign((g) => renameConditionIn(g.rest, g.nodes, c.id, e.target.value), `cond:${i}:id`)}
                />
                <Text
                  label="Label"
                  value={c.label ?? ""}
                  disabled={!editable}
                  onChange={(e) =>
                    updateRest((rest) => ({ ...rest, conditions: rest.conditions.map((x, k) => (k === i ? { ...x, label: e.target.value } : x)) }), `cond:${i}:label`)
                  }
                />
              </div>
              <div>
                <div className="text-xs font-medium text-ink-600">States</div>
                <ol className="mt-1 space-y-1">
                  {c.states.map((st, k) => (
                    <li key={k} className="flex items-center gap-1">
                      <input
                        aria-label={`State ${k + 1} of ${c.id}`}
                        className="w-full rounded border border-ink-300 px-2 py-0.5 text-sm"
                        value={st}
                        disabled={!editable}
                        onChange={(e) => updateDesign((g) => changeStateIn(g.rest, g.nodes, c.id, st, e.target.value), `state:${i}:${k}`)}
                      />
                      <Small tone="ghost" disabled={!editable || c.states.length <= 2} aria-label={`Remove state ${st}`} onClick={() => updateDesign((g) => changeStateIn(g.rest, g.nodes, c.id, st, null))}>
                        ✕
                      </Small>
                    </li>
                  ))}
                </ol>
                <form
                  className="mt-1 flex gap-1"
                  onSubmit={(e) => {
                    e.preventDefault();
                    const name = (newState[i] ?? "").trim();
                    if (!name) return;
                    updateRest((rest) => ({ ...rest, conditions: rest.conditions.map((x, k) => (k === i ? { ...x, states: [...x.states, name] } : x)) }));
                    setNewState({ ...newState, [i]: "" });
                  }}
                >
                  <input
                    aria-label={`New state of ${c.id}`}
                    placeholder="new state"
                    className="w-full rounded border border-ink-300 px-2 py-0.5 text-sm"
                    value={newState[i] ?? ""}
                    disabled={!editable || c.states.length >= 8}
                    onChange={(e) => setNewState({ ...newState, [i]: e.target.value })}
                  />
                  <Small type="submit" disabled={!editable || c.states.length >= 8}>
                    Add
                  </Small>
                </form>
              </div>
              <FieldProblems problems={here} />
              <Small tone="danger" disabled={!editable} onClick={() => updateRest((rest) => ({ ...rest, conditions: rest.conditions.filter((_, k) => k !== i) }))}>
                Remove condition {c.id}
              </Small>
            </fieldset>
          );
        })}
      </Section>
    </div>
  );
}
