// What a reviewer can read about a revision of any size, computed by the engine's row groups: the
// drive rows, each rule with why it holds (or where it fails), and the rows each defeating single
// fault breaks. Revisions never change, so each summary is cached per revision (a cache only).
import { groupRows, whyRuleHolds, type CompiledDesign, type Verdict } from "~/engine";
import type { FaultReading, Readable, RuleReading } from "./readable";

const cache = new Map<string, Readable>();
const MAX_ENTRIES = 16;

export function readableSummary(revisionId: string, c: CompiledDesign, verdict: Verdict, limit = 12): Readable {
  const key = `${revisionId}:${limit}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const holds = new Map(verdict.rules.map((r) => [r.id, r.holds]));
  const rules: RuleReading[] = c.rules.map((r) => {
    if (r.type === "require-drive") {
      return {
        type: "require-drive",
        id: r.id,
        label: r.label,
        holds: holds.get(r.id) ?? false,
        demand: groupRows(c, `demand:${r.id}`, { limit }),
        failing: groupRows(c, `failing:${r.id}`, { limit }),
      };
    }
    if (r.type !== "inhibit") return { type: "no-restart", id: r.id, label: r.label, holds: holds.get(r.id) ?? false };
    const forbids = r.forbidInput < 0 ? "drive" : `input ${c.inputs[r.forbidInput]!.label} (${c.inputs[r.forbidInput]!.id}) energized`;
    return {
      type: "inhibit",
      id: r.id,
      label: r.label,
      forbids,
      holds: holds.get(r.id) ?? false,
      unsafe: groupRows(c, `unsafe:${r.id}`, { limit }),
      violating: groupRows(c, `violating:${r.id}`, { limit }),
      why: r.forbidInput < 0 ? whyRuleHolds(c, r.id, { limit }) : null,
    };
  });
  const faults: FaultReading[] = verdict.singleFaults.map((f) => ({
    component: f.component,
    label: c.contacts[c.contactIndex[f.component]!]?.label ?? f.component,
    mode: f.mode,
    defeats: f.defeats,
    broken: groupRows(c, `broken:${f.component}/${f.mode}`, { limit }),
  }));
  // Plain JSON objects for the page's data (the engine's states maps have no prototype).
  const out: Readable = JSON.parse(
    JSON.stringify({
      rows: c.rows,
      conditions: c.conditions.map((x) => ({ id: x.id, label: x.label, states: x.states })),
      drive: groupRows(c, "drive", { limit }),
      rules,
      faults,
      limit,
    } satisfies Readable),
  );
  cache.set(key, out);
  while (cache.size > MAX_ENTRIES) cache.delete(cache.keys().next().value!);
  return out;
}
