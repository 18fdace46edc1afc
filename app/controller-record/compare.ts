// Two versions of a record side by side: every field whose value differs, in the form's order, then
// any other key (kept from the API) by its path.
import { LOCKOUTS, type Lockout } from "../engine/index";
import { CHEMISTRY_WORDS, FIELD_WORDS, SENSOR_WORDS, type RecordField } from "./words";

export type RecordChange = { path: string; label: string; unit?: string; before: string; after: string };

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === "object" && v !== null && !Array.isArray(v);

/** Leaves of a document by dotted path; arrays are leaves. */
export function leaves(doc: unknown, prefix = "", out = new Map<string, unknown>()): Map<string, unknown> {
  if (isObj(doc)) {
    for (const [k, v] of Object.entries(doc)) leaves(v, prefix === "" ? k : `${prefix}.${k}`, out);
  } else if (prefix !== "") {
    out.set(prefix, doc);
  }
  return out;
}

/** A value as the page writes it; absent is "—". */
export function showValue(path: string, v: unknown): string {
  if (v === undefined) return "—";
  if (path === "pack.chemistry" && typeof v === "string" && v in CHEMISTRY_WORDS) return CHEMISTRY_WORDS[v as keyof typeof CHEMISTRY_WORDS];
  if (path === "settings.throttle.sensor" && typeof v === "string" && v in SENSOR_WORDS)
    return SENSOR_WORDS[v as keyof typeof SENSOR_WORDS];
  if (path === "settings.brakeCutsDrive") return v === false ? "no" : "yes";
  if (path === "settings.lockouts" && Array.isArray(v)) return v.length === 0 ? "none" : (v as Lockout[]).join(", ");
  if (typeof v === "string") return v === "" ? "(empty)" : v;
  return JSON.stringify(v);
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

/** What changed from `before` to `after`. */
export function compareRecords(before: unknown, after: unknown): RecordChange[] {
  const a = leaves(before);
  const b = leaves(after);
  // An absent brake setting and lockout list read as their defaults (cuts drive; none).
  // A lockout list is a set: compared and shown in the design format's order, each once.
  for (const m of [a, b]) {
    if (!m.has("settings.brakeCutsDrive")) m.set("settings.brakeCutsDrive", true);
    const listed = m.get("settings.lockouts") ?? [];
    if (Array.isArray(listed))
      m.set(
        "settings.lockouts",
        LOCKOUTS.filter((l) => listed.includes(l)),
      );
  }
  const known = Object.keys(FIELD_WORDS) as RecordField[];
  const others = [...new Set([...a.keys(), ...b.keys()])].filter((p) => !(known as string[]).includes(p)).sort();
  const out: RecordChange[] = [];
  for (const path of [...known, ...others]) {
    const [x, y] = [a.get(path), b.get(path)];
    if (same(x, y)) continue;
    const words = (FIELD_WORDS as Record<string, { label: string; unit?: string }>)[path];
    out.push({ path, label: words?.label ?? path, unit: words?.unit, before: showValue(path, x), after: showValue(path, y) });
  }
  return out;
}
