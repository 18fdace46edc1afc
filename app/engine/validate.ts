// Validation: zod for the shape, then every cross-reference rule of the spec (section 3).
// Cross-reference checks run on the raw input even when the shape is broken elsewhere, skipping
// whatever is malformed (zod already reports it), so one pass lists every problem.
import { predicateMatchesSomeRow } from "./satisfiable";
import { designSchema, TERMINALS, type Design, type Predicate, type Problem } from "./schema";

/** The largest truth table the engine accepts (2^24 rows). */
export const ENGINE_ROW_LIMIT = 2 ** 24;

export type ValidationResult = { ok: true; design: Design } | { ok: false; problems: Problem[] };

/** Formats a zod-style path: ["components", 3, "closedIn", 0] -> "components[3].closedIn[0]". */
export function formatPath(path: ReadonlyArray<PropertyKey>): string {
  let out = "";
  for (const seg of path) {
    if (typeof seg === "number") out += `[${seg}]`;
    else out += out === "" ? String(seg) : `.${String(seg)}`;
  }
  return out;
}

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === "object" && v !== null && !Array.isArray(v);
const isStr = (v: unknown): v is string => typeof v === "string";
const arr = (v: unknown): unknown[] => (Array.isArray(v) ? v : []);
const q = (s: string) => JSON.stringify(s);

export function validateDesign(input: unknown): ValidationResult {
  const { parsed, problems, matchingNoRow } = check(input);
  const all = [...problems, ...matchingNoRow];
  if (all.length > 0 || !parsed.success) {
    return { ok: false, problems: dedupe(all) };
  }
  return { ok: true, design: parsed.data };
}

export type StoredValidationResult = { ok: true; design: Design; rulesMatchingNoRow: Problem[] } | { ok: false; problems: Problem[] };

/**
 * A design stored before version 1.1: every check of `validateDesign` except "a rule whose `when`
 * holds in no row", whose problems come back apart in `rulesMatchingNoRow`. Such a revision stays
 * readable (its rows, verdict and report) while the server marks it as one 1.1 would refuse.
 */
export function validateStoredDesign(input: unknown): StoredValidationResult {
  const { parsed, problems, matchingNoRow } = check(input);
  if (problems.length > 0 || !parsed.success) return { ok: false, problems: dedupe([...problems, ...matchingNoRow]) };
  return { ok: true, design: parsed.data, rulesMatchingNoRow: dedupe(matchingNoRow) };
}

function check(input: unknown) {
  const problems: Problem[] = [];
  const parsed = designSchema.safeParse(input);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      problems.push({ path: formatPath(issue.path), message: issue.message });
    }
  }
  if (isObj(input)) crossReferences(input, problems);
  const matchingNoRow: Problem[] = [];
  if (isObj(input)) emptyRules(input, problems, matchingNoRow);
  return { parsed, problems, matchingNoRow };
}

function dedupe(problems: Problem[]): Problem[] {
  const seen = new Set<string>();
  return problems.filter((p) => {
    const key = `${p.path}\u0000${p.message}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

function crossReferences(d: Obj, problems: Problem[]): void {
  const add = (path: string, message: string) => problems.push({ path, message });

  // Conditions: unique ids, 2-8 distinct states, row limit.
  const conditionStates = new Map<string, string[]>();
  const conditionAt = new Map<string, number>();
  let rows = 1;
  arr(d.conditions).forEach((c, i) => {
    if (!isObj(c)) return;
    const states = arr(c.states).filter(isStr);
    const seen = new Map<string, number>();
    arr(c.states).forEach((s, k) => {
      if (!isStr(s)) return;
      if (seen.has(s)) add(`conditions[${i}].states[${k}]`, `state ${q(s)} is listed twice (first at states[${seen.get(s)}])`);
      else seen.set(s, k);
    });
    const distinct = seen.size;
    if (Array.isArray(c.states) && (distinct < 2 || distinct > 8)) {
      add(`conditions[${i}].states`, `a condition has 2 to 8 distinct states; this one has ${distinct}`);
    }
    rows *= Math.max(1, distinct);
    if (!isStr(c.id)) return;
    if (conditionAt.has(c.id)) {
      add(`conditions[${i}].id`, `duplicate condition id ${q(c.id)} (first at conditions[${conditionAt.get(c.id)}])`);
      return;
    }
    conditionAt.set(c.id, i);
    conditionStates.set(c.id, states);
  });
  if (rows > ENGINE_ROW_LIMIT) {
    add("conditions", `the truth table would have ${rows} rows; the engine's limit is ${ENGINE_ROW_LIMIT} rows (2^24)`);
  }

  const checkState = (condId: string, state: unknown, path: string) => {
    const states = conditionStates.get(condId);
    if (states && isStr(state) && !states.includes(state)) {
      add(path, `state ${q(state)} is not a state of condition ${q(condId)}`);
    }
  };
  const checkCondition = (condId: unknown, path: string): condId is string => {
    if (!isStr(condId)) return false;
    if (!conditionStates.has(condId)) {
      add(path, `no condition with id ${q(condId)}`);
      return false;
    }
    return true;
  };

  // Components: unique ids (also against conditions), contact references, one input per function.
  const componentType = new Map<string, string>();
  const componentAt = new Map<string, number>();
  const functionAt = new Map<string, number>();
  let supplies = 0;
  arr(d.components).forEach((c, i) => {
    if (!isObj(c)) return;
    if (isStr(c.id)) {
      if (componentAt.has(c.id)) {
        add(`components[${i}].id`, `duplicate component id ${q(c.id)} (first at components[${componentAt.get(c.id)}])`);
      } else {
        if (conditionAt.has(c.id)) {
          add(`components[${i}].id`, `component id ${q(c.id)} is also the id of a condition (conditions[${conditionAt.get(c.id)}])`);
        }
        componentAt.set(c.id, i);
        if (isStr(c.type)) componentType.set(c.id, c.type);
      }
    }
    if (c.type === "supply") supplies++;
    if (c.type === "contact" && checkCondition(c.condition, `components[${i}].condition`)) {
      arr(c.closedIn).forEach((s, k) => checkState(c.condition as string, s, `components[${i}].closedIn[${k}]`));
    }
    if (c.type === "input" && isStr(c.function)) {
      if (functionAt.has(c.function)) {
        add(
          `components[${i}].function`,
          `a second input with function ${q(c.function)} (the first is components[${functionAt.get(c.function)}])`,
        );
      } else functionAt.set(c.function, i);
    }
  });
  if (Array.isArray(d.components) && supplies === 0) add("components", "the design has no supply");

  // Wires: both ends name an existing component and one of its terminals.
  arr(d.wires).forEach((w, i) => {
    if (!isObj(w)) return;
    for (const end of ["from", "to"] as const) {
      const ref = w[end];
      if (!isStr(ref)) continue;
      const path = `wires[${i}].${end}`;
      const dot = ref.lastIndexOf(".");
      if (dot <= 0) {
        add(path, `${q(ref)} is not a terminal; write COMPONENT.TERMINAL, e.g. "S1.1"`);
        continue;
      }
      const compId = ref.slice(0, dot);
      const term = ref.slice(dot + 1);
      const type = componentType.get(compId);
      if (!componentAt.has(compId)) {
        add(path, `no component with id ${q(compId)}`);
      } else if (type && Object.hasOwn(TERMINALS, type)) {
        const terms = TERMINALS[type as keyof typeof TERMINALS] as readonly string[];
        if (!terms.includes(term)) {
          add(path, `component ${q(compId)} (${type}) has no terminal ${q(term)}; its terminals are ${terms.join(", ")}`);
        }
      }
    }
  });

  // Controller: the throttle mapping is a partition of its condition's states.
  const ctl = d.controller;
  if (isObj(ctl) && isObj(ctl.throttle)) {
    const t = ctl.throttle;
    if (checkCondition(t.condition, "controller.throttle.condition")) {
      const condId = t.condition as string;
      const classOf = new Map<string, string>();
      for (const cls of ["released", "applied", "fault"] as const) {
        const list = t[cls];
        if (cls !== "fault" && Array.isArray(list) && list.length === 0) {
          add(`controller.throttle.${cls}`, `the throttle needs at least one ${cls} state`);
        }
        arr(list).forEach((s, k) => {
          if (!isStr(s)) return;
          const path = `controller.throttle.${cls}[${k}]`;
          const before = classOf.get(s);
          if (before !== undefined && before !== cls) {
            add(path, `state ${q(s)} is already in throttle class ${q(before)}; a state belongs to exactly one class`);
          } else if (before === undefined) {
            checkState(condId, s, path);
            classOf.set(s, cls);
          }
        });
      }
      for (const s of conditionStates.get(condId) ?? []) {
        if (!classOf.has(s)) {
          add("controller.throttle", `state ${q(s)} of condition ${q(condId)} is in no throttle class (released, applied, fault)`);
        }
      }
    }
  }

  // Rules: unique ids, predicates name known conditions and states, forbid names an input.
  const ruleAt = new Map<string, number>();
  arr(d.rules).forEach((r, i) => {
    if (!isObj(r)) return;
    if (isStr(r.id)) {
      if (ruleAt.has(r.id)) add(`rules[${i}].id`, `duplicate rule id ${q(r.id)} (first at rules[${ruleAt.get(r.id)}])`);
      else ruleAt.set(r.id, i);
    }
    if (r.type !== "inhibit" && r.type !== "require-drive") return;
    checkPredicate(r.when, `rules[${i}].when`, 0);
    if (r.type !== "inhibit") return;
    if (isObj(r.forbid) && isStr(r.forbid.energized)) {
      const target = r.forbid.energized;
      const type = componentType.get(target);
      if (!componentAt.has(target)) add(`rules[${i}].forbid.energized`, `no component with id ${q(target)}`);
      else if (type !== undefined && type !== "input") {
        add(`rules[${i}].forbid.energized`, `component ${q(target)} is a ${type}, not an input`);
      }
    }
  });

  function checkPredicate(p: unknown, path: string, depth: number): void {
    if (!isObj(p)) return;
    if (depth > 64) {
      add(path, "predicate nested more than 64 levels deep");
      return;
    }
    if (p.cond !== undefined && checkCondition(p.cond, `${path}.cond`)) {
      arr(p.in).forEach((s, k) => checkState(p.cond as string, s, `${path}.in[${k}]`));
    }
    arr(p.all).forEach((c, k) => checkPredicate(c, `${path}.all[${k}]`, depth + 1));
    arr(p.any).forEach((c, k) => checkPredicate(c, `${path}.any[${k}]`, depth + 1));
    if (p.not !== undefined) checkPredicate(p.not, `${path}.not`, depth + 1);
  }
}

/**
 * Spec 1.6 (version 1.1): a rule whose `when` holds in no row says nothing and makes the design
 * invalid, at `rules[i].when`. Only a `when` that is otherwise valid is looked at (no problem found
 * at or under its path), and only when the conditions themselves are sound (no problem under
 * `conditions`, so the rows are well defined and within the engine's limit).
 */
function emptyRules(d: Obj, problems: readonly Problem[], out: Problem[]): void {
  if (problems.some((p) => p.path === "conditions" || p.path.startsWith("conditions["))) return;
  const statesOf = new Map<string, string[]>();
  for (const c of arr(d.conditions)) {
    if (isObj(c) && isStr(c.id)) statesOf.set(c.id, [...new Set(arr(c.states).filter(isStr))]);
  }
  arr(d.rules).forEach((r, i) => {
    if (!isObj(r) || (r.type !== "inhibit" && r.type !== "require-drive") || !isObj(r.when)) return;
    const path = `rules[${i}].when`;
    if (problems.some((p) => p.path === path || p.path.startsWith(`${path}.`) || p.path.startsWith(`${path}[`))) return;
    if (predicateMatchesSomeRow(r.when as Predicate, (id) => statesOf.get(id)!)) return;
    const why = 'holds in no row of the truth table (an empty list of states, an "any" of nothing, or states that cannot occur together)';
    out.push({
      path,
      message: `"when" ${why}, so this rule ${r.type === "inhibit" ? "checks nothing" : "demands drive in no row"}`,
    });
  });
}
