// Safety rules: require-drive rules ("must drive when", a visual predicate), inhibit rules (a visual
// predicate and what it forbids) and the no-restart rule. A rule whose situation matches no row is
// shown at the rule by the live check (the engine reports it at rules[i].when).
import type { ReactNode } from "react";
import type { InhibitRule, RequireDriveRule, Rule } from "../../engine";
import { useEditor, useEditorStore } from "../store";
import { CommitText, FieldProblems, Section, Select, Small, problemsUnder, useValidation } from "./common";
import { PredicateEditor } from "./predicate-editor";
import { cardVariants } from "../../components/ui/card";

function freshRuleId(rules: readonly Rule[], base: string) {
  for (let n = 1; ; n++) if (!rules.some((r) => r.id === `${base}${n}`)) return `${base}${n}`;
}

export function RulesPanel() {
  const rules = useEditor((s) => s.rest.rules);
  const conditions = useEditor((s) => s.rest.conditions);
  const inputs = useEditor((s) =>
    s.nodes
      .filter((n) => n.type === "input")
      .map((n) => n.id)
      .join("\u0000"),
  );
  const editable = useEditor((s) => !s.readOnly && s.simulation === null);
  const updateRest = useEditor((s) => s.updateRest);
  const store = useEditorStore();
  const problems = useValidation();
  const noRestart = rules.findIndex((r) => r.type === "no-restart");
  const inputIds = inputs ? inputs.split("\u0000") : [];

  const setRule = (i: number, r: Rule) => store.getState().updateRule(i, () => r);

  return (
    <div>
      <Section
        title="Must drive when"
        actions={
          <Small
            tone="primary"
            disabled={!editable}
            onClick={() =>
              updateRest((rest) => ({
                ...rest,
                rules: [
                  ...rest.rules,
                  {
                    id: freshRuleId(rest.rules, "D"),
                    label: "",
                    type: "require-drive",
                    when: { cond: rest.conditions[0]?.id ?? "", in: [] },
                  },
                ],
              }))
            }
          >
            + Must drive when …
          </Small>
        }
      >
        {rules.every((r) => r.type !== "require-drive") ? (
          <p className="text-sm text-ink-500">
            No require-drive rule yet. Say when the vehicle must drive (seated, key on, in gear, throttle applied): without one, a design
            that never drives would satisfy every inhibit rule.
          </p>
        ) : null}
        {rules.map((r, i) =>
          r.type === "require-drive" ? (
            <RequireDriveRuleForm
              key={i}
              index={i}
              rule={r}
              editable={editable}
              conditions={conditions}
              onChange={(next) => setRule(i, next)}
              onRename={(next) => store.getState().renameRule(i, next)}
              onRemove={() => store.getState().removeRule(i)}
              problems={problemsUnder(problems, `rules[${i}]`)}
            />
          ) : null,
        )}
      </Section>
      <Section
        title="Inhibit rules"
        actions={
          <Small
            tone="primary"
            disabled={!editable}
            onClick={() =>
              updateRest((rest) => ({
                ...rest,
                rules: [
                  ...rest.rules,
                  {
                    id: freshRuleId(rest.rules, "R"),
                    label: "",
                    type: "inhibit",
                    when: { cond: rest.conditions[0]?.id ?? "", in: [] },
                    forbid: "drive",
                  },
                ],
              }))
            }
          >
            + Inhibit rule
          </Small>
        }
      >
        {rules.every((r) => r.type !== "inhibit") ? (
          <p className="text-sm text-ink-500">
            No inhibit rules yet. An inhibit rule names the situations in which drive (or an input) must be off.
          </p>
        ) : null}
        {rules.map((r, i) =>
          r.type === "inhibit" ? (
            <InhibitRuleForm
              key={i}
              index={i}
              rule={r}
              editable={editable}
              conditions={conditions}
              inputs={inputIds}
              onChange={(next) => setRule(i, next)}
              onRename={(next) => store.getState().renameRule(i, next)}
              onRemove={() => store.getState().removeRule(i)}
              problems={problemsUnder(problems, `rules[${i}]`)}
            />
          ) : null,
        )}
      </Section>
      <Section title="No restart on a held throttle">
        <label className="flex items-start gap-2 text-sm">
          <input
            type="checkbox"
            className="mt-1"
            checked={noRestart >= 0}
            disabled={!editable}
            onChange={(e) =>
              updateRest((rest) => ({
                ...rest,
                rules: e.target.checked
                  ? [
                      ...rest.rules,
                      { id: freshRuleId(rest.rules, "no-restart-"), label: "No start on a held throttle", type: "no-restart" },
                    ]
                  : rest.rules.filter((x) => x.type !== "no-restart"),
              }))
            }
          />
          <span>
            Drive must never come on at a step where the throttle was not released just before: the controller&apos;s lockouts have to catch
            every way of arriving with the throttle already applied.
          </span>
        </label>
        {noRestart >= 0 ? <FieldProblems problems={problemsUnder(problems, `rules[${noRestart}]`)} /> : null}
      </Section>
    </div>
  );
}

type RuleFormProps<R> = {
  index: number;
  rule: R;
  editable: boolean;
  conditions: Parameters<typeof PredicateEditor>[0]["conditions"];
  onChange: (r: R) => void;
  onRename: (id: string) => string | null;
  onRemove: () => void;
  problems: ReturnType<typeof problemsUnder>;
};

/**
 * What every rule form has: its box, the id and label, the situation it speaks of, its problems and
 * its remove button; `children` is what the rule type adds after the situation.
 */
function RuleForm<R extends RequireDriveRule | InhibitRule>({
  index,
  rule,
  editable,
  conditions,
  onChange,
  onRename,
  onRemove,
  problems,
  heading,
  edge,
  children,
}: RuleFormProps<R> & { heading?: string; edge: "line" | "proven"; children: ReactNode }) {
  return (
    <fieldset
      className={cardVariants({ padding: "xs", edge, className: "space-y-2" })}
      aria-label={`Rule ${rule.id}`}
      data-testid={`rule-${rule.id}`}
    >
      <RuleIdAndLabel
        rule={rule}
        editable={editable}
        idInvalid={problems.some((p) => p.path === `rules[${index}].id`)}
        onRename={onRename}
        onLabel={(label) => onChange({ ...rule, label })}
      />
      <PredicateEditor
        heading={heading}
        value={rule.when ?? { always: true }}
        onChange={(when) => onChange({ ...rule, when })}
        conditions={conditions}
        disabled={!editable}
        path={`rules[${index}].when`}
      />
      {children}
      <FieldProblems problems={problems} />
      <Small tone="danger" disabled={!editable} onClick={onRemove}>
        Remove rule {rule.id}
      </Small>
    </fieldset>
  );
}

function RequireDriveRuleForm(props: RuleFormProps<RequireDriveRule>) {
  return (
    <RuleForm {...props} heading="Must drive when" edge="proven">
      <p className="text-xs text-ink-600">In every row where this holds, the drive must be on.</p>
    </RuleForm>
  );
}

/** The id and label every rule has, committed like the other ids of the editor. */
function RuleIdAndLabel({
  rule,
  editable,
  idInvalid,
  onRename,
  onLabel,
}: {
  rule: { id: string; label?: string };
  editable: boolean;
  idInvalid: boolean;
  onRename: (id: string) => string | null;
  onLabel: (label: string) => void;
}) {
  return (
    <div className="grid grid-cols-[6rem_1fr] gap-2">
      <CommitText label="Id" value={rule.id} disabled={!editable} onCommit={onRename} invalid={idInvalid} />
      <CommitText
        label="Label"
        value={rule.label ?? ""}
        disabled={!editable}
        onCommit={(label) => {
          onLabel(label);
          return null;
        }}
      />
    </div>
  );
}

function InhibitRuleForm({ inputs, ...props }: RuleFormProps<InhibitRule> & { inputs: string[] }) {
  const { rule, editable, onChange } = props;
  const forbid =
    rule.forbid === "drive" ? "drive" : typeof rule.forbid === "object" && rule.forbid ? `energized:${rule.forbid.energized}` : "drive";
  return (
    <RuleForm {...props} edge="line">
      <Select
        label="Then forbid"
        value={forbid}
        disabled={!editable}
        onChange={(e) =>
          onChange({ ...rule, forbid: e.target.value === "drive" ? "drive" : { energized: e.target.value.slice("energized:".length) } })
        }
      >
        <option value="drive">drive</option>
        {inputs.map((id) => (
          <option key={id} value={`energized:${id}`}>
            input {id} energized
          </option>
        ))}
        {forbid !== "drive" && !inputs.includes(forbid.slice(10)) ? (
          <option value={forbid}>{forbid.slice(10)} energized (missing)</option>
        ) : null}
      </Select>
    </RuleForm>
  );
}
