// The visual rule picker: "condition is one of these states" tests combined by all / any / not.
// No typed formula language: every form of the spec's predicate has its own control.
import type { Condition, Predicate } from "../../engine";
import { Select, Small, StateChips, toggle } from "./common";

type Kind = "cond" | "all" | "any" | "not" | "always";
const KIND_LABEL: Record<Kind, string> = {
  cond: "condition is one of",
  all: "all of these hold",
  any: "any of these holds",
  not: "this does not hold",
  always: "always (every row)",
};

const kindOf = (p: Predicate): Kind => ("cond" in p ? "cond" : "all" in p ? "all" : "any" in p ? "any" : "not" in p ? "not" : "always");

function firstTest(conditions: readonly Condition[]): Predicate {
  return { cond: conditions[0]?.id ?? "", in: [] };
}

function convert(p: Predicate, to: Kind, conditions: readonly Condition[]): Predicate {
  const from = kindOf(p);
  if (from === to) return p;
  switch (to) {
    case "cond":
      return from === "not" && "not" in p && kindOf(p.not) === "cond" ? p.not : firstTest(conditions);
    case "all":
    case "any": {
      const children = "all" in p ? p.all : "any" in p ? p.any : from === "always" ? [] : [p];
      return to === "all" ? { all: children } : { any: children };
    }
    case "not":
      return { not: from === "always" ? firstTest(conditions) : p };
    case "always":
      return { always: true };
  }
}

export function PredicateEditor({
  value,
  onChange,
  conditions,
  disabled,
  path = "when",
  depth = 0,
  heading = "Forbidden when",
}: {
  value: Predicate;
  onChange: (next: Predicate) => void;
  conditions: readonly Condition[];
  disabled?: boolean;
  path?: string;
  depth?: number;
  /** The top-level label: what the rule does where the predicate holds. */
  heading?: string;
}) {
  const kind = kindOf(value);
  return (
    <div className={`space-y-2 ${depth > 0 ? "rounded border border-ink-200 bg-ink-50 p-2" : ""}`} data-path={path}>
      <Select
        label={depth === 0 ? heading : "Test"}
        value={kind}
        disabled={disabled}
        onChange={(e) => onChange(convert(value, e.target.value as Kind, conditions))}
      >
        {(Object.keys(KIND_LABEL) as Kind[]).map((k) => (
          <option key={k} value={k}>
            {KIND_LABEL[k]}
          </option>
        ))}
      </Select>
      {"cond" in value ? (
        <ConditionTest value={value} onChange={onChange} conditions={conditions} disabled={disabled} />
      ) : "all" in value || "any" in value ? (
        <Group value={value} onChange={onChange} conditions={conditions} disabled={disabled} path={path} depth={depth} />
      ) : "not" in value ? (
        <div className="border-l-2 border-copper-500 pl-2">
          <PredicateEditor
            value={value.not}
            onChange={(inner) => onChange({ not: inner })}
            conditions={conditions}
            disabled={disabled}
            path={`${path}.not`}
            depth={depth + 1}
          />
        </div>
      ) : null}
    </div>
  );
}

function ConditionTest({
  value,
  onChange,
  conditions,
  disabled,
}: {
  value: { cond: string; in: string[] };
  onChange: (p: Predicate) => void;
  conditions: readonly Condition[];
  disabled?: boolean;
}) {
  const c = conditions.find((x) => x.id === value.cond);
  return (
    <div className="space-y-1">
      <Select label="Condition" value={value.cond} disabled={disabled} onChange={(e) => onChange({ cond: e.target.value, in: [] })}>
        {c ? null : <option value={value.cond}>{value.cond || "(pick a condition)"}</option>}
        {conditions.map((x) => (
          <option key={x.id} value={x.id}>
            {x.label ? `${x.label} (${x.id})` : x.id}
          </option>
        ))}
      </Select>
      <div className="text-xs text-ink-600">is one of</div>
      <StateChips
        label={`States of ${c?.label || value.cond}`}
        states={c?.states ?? []}
        picked={value.in}
        disabled={disabled}
        onToggle={(st) => onChange({ cond: value.cond, in: toggle(value.in, st, c?.states ?? []) })}
      />
    </div>
  );
}

function Group({
  value,
  onChange,
  conditions,
  disabled,
  path,
  depth,
}: {
  value: { all: Predicate[] } | { any: Predicate[] };
  onChange: (p: Predicate) => void;
  conditions: readonly Condition[];
  disabled?: boolean;
  path: string;
  depth: number;
}) {
  const key = "all" in value ? "all" : "any";
  const children = "all" in value ? value.all : value.any;
  const set = (list: Predicate[]) => onChange(key === "all" ? { all: list } : { any: list });
  return (
    <div className="space-y-2 border-l-2 border-ink-300 pl-2">
      {children.length === 0 ? (
        <p className="text-xs text-ink-500">{key === "all" ? "Empty: holds in every row." : "Empty: holds in no row."}</p>
      ) : null}
      {children.map((child, i) => (
        <div key={i} className="relative">
          <PredicateEditor
            value={child}
            onChange={(next) => set(children.map((c, k) => (k === i ? next : c)))}
            conditions={conditions}
            disabled={disabled}
            path={`${path}.${key}[${i}]`}
            depth={depth + 1}
          />
          <Small
            tone="ghost"
            disabled={disabled}
            className="mt-1"
            onClick={() => set(children.filter((_, k) => k !== i))}
            aria-label={`Remove test ${i + 1}`}
          >
            Remove
          </Small>
        </div>
      ))}
      <div className="flex gap-1">
        <Small disabled={disabled} onClick={() => set([...children, firstTest(conditions)])}>
          + Condition test
        </Small>
        <Small disabled={disabled} onClick={() => set([...children, { any: [] }])}>
          + Group
        </Small>
      </div>
    </div>
  );
}
