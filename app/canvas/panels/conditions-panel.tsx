// Conditions (the truth table's inputs) and their states. Ids and state names change when the
// field is committed (Enter or leaving it), as one undo step that carries every reference along;
// a name that would collide is refused at the field.
import { useState } from "react";
import { STATES_MAX } from "../edits";
import { useEditor, useEditorStore } from "../store";
import { CommitText, FieldProblems, Section, Small, problemsUnder, useValidation } from "./common";
import { cardVariants } from "../../components/ui/card";

export function ConditionsPanel() {
  const conditions = useEditor((s) => s.rest.conditions);
  const editable = useEditor((s) => !s.readOnly && s.simulation === null);
  const addCondition = useEditor((s) => s.addCondition);
  const problems = useValidation();

  return (
    <div>
      <Section
        title="Conditions"
        actions={
          <Small tone="primary" disabled={!editable} onClick={addCondition}>
            + Condition
          </Small>
        }
      >
        <FieldProblems problems={problems.filter((p) => p.path === "conditions")} />
        <p className="text-xs text-ink-500">
          The first state of each condition is its rest state; contacts that conduct there are drawn normally closed. Ids and state names
          change when you press Enter or leave the field.
        </p>
        {conditions.map((c, i) => (
          <ConditionCard key={i} index={i} editable={editable} problems={problemsUnder(problems, `conditions[${i}]`)} />
        ))}
      </Section>
    </div>
  );
}

function ConditionCard({
  index: i,
  editable,
  problems: here,
}: {
  index: number;
  editable: boolean;
  problems: ReturnType<typeof problemsUnder>;
}) {
  const c = useEditor((s) => s.rest.conditions[i]);
  const store = useEditorStore().getState;
  const [newState, setNewState] = useState("");
  const [error, setError] = useState<string | null>(null);
  if (!c) return null;
  return (
    <fieldset
      className={cardVariants({ padding: "xs", className: "space-y-2" })}
      aria-label={`Condition ${c.id}`}
      data-testid={`condition-${c.id}`}
    >
      <div className="grid grid-cols-[7rem_1fr] gap-2">
        <CommitText
          label="Id"
          value={c.id}
          disabled={!editable}
          invalid={here.some((p) => p.path === `conditions[${i}].id`)}
          onCommit={(v) => store().renameCondition(i, v)}
        />
        <CommitText label="Label" value={c.label ?? ""} disabled={!editable} onCommit={(v) => (store().setConditionLabel(i, v), null)} />
      </div>
      <div>
        <div className="text-xs font-medium text-ink-600">States</div>
        <ol className="mt-1 space-y-1">
          {c.states.map((st, k) => (
            <li key={`${k}:${c.states.length}`} className="flex items-start gap-1">
              <CommitText
                className="min-w-0 flex-1"
                label={`State ${k + 1} of ${c.id}`}
                hideLabel
                value={st}
                disabled={!editable}
                invalid={here.some((p) => p.path === `conditions[${i}].states[${k}]`)}
                onCommit={(v) => store().renameState(i, k, v)}
              />
              <Small
                tone="ghost"
                disabled={!editable || c.states.length <= 2}
                aria-label={`Remove state ${k + 1} (${st}) of ${c.id}`}
                onClick={() => setError(store().removeState(i, k))}
              >
                ✕
              </Small>
            </li>
          ))}
        </ol>
        <form
          className="mt-1 flex gap-1"
          onSubmit={(e) => {
            e.preventDefault();
            const why = store().addState(i, newState);
            setError(why);
            if (!why) setNewState("");
          }}
        >
          <input
            aria-label={`New state of ${c.id}`}
            placeholder="new state"
            className="w-full rounded border border-ink-300 px-2 py-0.5 text-sm"
            value={newState}
            disabled={!editable || c.states.length >= STATES_MAX}
            onChange={(e) => setNewState(e.target.value)}
          />
          <Small type="submit" disabled={!editable || c.states.length >= STATES_MAX}>
            Add
          </Small>
        </form>
      </div>
      {error ? (
        <p role="alert" className="text-xs text-brick-700 [overflow-wrap:anywhere]">
          Not changed: {error}.
        </p>
      ) : null}
      <FieldProblems problems={here} />
      <Small tone="danger" disabled={!editable} onClick={() => setError(store().removeCondition(i))}>
        Remove condition {c.id}
      </Small>
    </fieldset>
  );
}
