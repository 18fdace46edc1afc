// A rule and its condition in words, for the printed report (the engine's predicate, spelled out).
import type { Design, Predicate } from "~/engine";

export function predicateText(p: Predicate): string {
  if ("cond" in p) return `${p.cond} is ${p.in.join(" or ")}`;
  if ("all" in p) return p.all.length === 0 ? "always" : p.all.map((x) => `(${predicateText(x)})`).join(" and ");
  if ("any" in p) return p.any.length === 0 ? "never" : p.any.map((x) => `(${predicateText(x)})`).join(" or ");
  if ("not" in p) return `not (${predicateText(p.not)})`;
  return "always";
}

export function ruleText(r: Design["rules"][number]): string {
  if (r.type === "no-restart") return "The drive never comes on while the throttle was already held (any sequence of steps from power-up).";
  if (r.type === "require-drive") return `When ${predicateText(r.when)}: the drive must be on.`;
  const forbid = r.forbid === "drive" ? "the drive" : `input ${r.forbid.energized} energized`;
  return `When ${predicateText(r.when)}: no ${forbid}.`;
}
