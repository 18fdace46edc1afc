// Malformed designs and request bodies for fuzz tests: valid documents (the spec's examples and the
// demo designs) with a few mutations each, arbitrary JSON, and raw text or bytes. Also a check that a
// problem's field path names a place in the document it was reported for.
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import fc from "fast-check";

export type Json = null | boolean | number | string | Json[] | { [key: string]: Json };
type Obj = { [key: string]: Json };
type Seg = string | number;

const isObj = (v: unknown): v is Obj => typeof v === "object" && v !== null && !Array.isArray(v);

// The spec's examples live in shared/ beside the repository (also in CI).
const EXAMPLES = [path.resolve(process.cwd(), "../shared/spec/examples"), "/work/shared/spec/examples"].find((d) => existsSync(d));
const DEMO = path.resolve(import.meta.dirname, "../../drizzle/demo-designs");
const readJson = (file: string) => JSON.parse(readFileSync(file, "utf8")) as Obj;

/** The valid starting points: every design the project ships (each passes validateDesign). */
export const BASE_DESIGNS: Obj[] = [
  ...(EXAMPLES ? ["campus-hauler", "deck-mower", "trail-bike"].map((n) => readJson(`${EXAMPLES}/${n}.design.json`)) : []),
  ...["haybarn-campus-hauler.json", "meadowline-deck-mower.r1.json", "meadowline-deck-mower.draft.json", "scree-trail-bike.draft.json"].map(
    (f) => readJson(`${DEMO}/${f}`),
  ),
];

// ---------------------------------------------------------------- walking a JSON value

function pathsOf(v: Json, at: Seg[] = [], out: Seg[][] = []): Seg[][] {
  out.push(at);
  if (Array.isArray(v)) v.forEach((x, i) => pathsOf(x, [...at, i], out));
  else if (isObj(v)) for (const k of Object.keys(v)) pathsOf(v[k]!, [...at, k], out);
  return out;
}

function get(v: Json, at: Seg[]): Json {
  let cur: Json = v;
  for (const s of at) cur = (cur as Record<string | number, Json>)[s]!;
  return cur;
}

/** Sets a property as an own, enumerable one, even "__proto__" (as JSON.parse would). */
function setOwn(o: Obj | Json[], key: Seg, value: Json): void {
  Object.defineProperty(o, key, { value, enumerable: true, writable: true, configurable: true });
}

function put(root: Json, at: Seg[], value: Json): Json {
  if (at.length === 0) return value;
  setOwn(get(root, at.slice(0, -1)) as Obj, at[at.length - 1]!, value);
  return root;
}

function remove(root: Json, at: Seg[]): Json {
  if (at.length === 0) return root;
  const parent = get(root, at.slice(0, -1));
  const last = at[at.length - 1]!;
  if (Array.isArray(parent)) parent.splice(last as number, 1);
  else delete (parent as Obj)[last];
  return root;
}

/** A deep copy that keeps own "__proto__" keys (structuredClone and spread would not). */
export function cloneJson<T extends Json>(v: T): T {
  if (Array.isArray(v)) return v.map((x) => cloneJson(x)) as T;
  if (isObj(v)) {
    const out: Obj = {};
    for (const k of Object.keys(v)) setOwn(out, k, cloneJson(v[k]!));
    return out as T;
  }
  return v;
}

const typeOf = (v: Json) => (v === null ? "null" : Array.isArray(v) ? "array" : typeof v);

// ---------------------------------------------------------------- mutations

/** Values of every JSON type, and edge cases of each. */
const ODD_VALUES: Json[] = [
  null,
  true,
  false,
  0,
  -1,
  1.5,
  2 ** 31,
  2 ** 53 + 2,
  -(2 ** 53),
  1e308,
  -1e-308,
  "",
  " ",
  "x",
  "0",
  "true",
  "null",
  [],
  [null],
  [[]],
  {},
  { id: "x" },
  { cond: "x", in: [] },
  { all: [] },
  { always: false },
  ["a", "a"],
];

const ODD_TEXT: string[] = [
  "\u0000",
  "a\u0000b",
  "\ud800",
  "x\udc00",
  "\udc00\ud800",
  "e\u0301",
  "\u202eRTL",
  "\u200b",
  "\ufeffBOM",
  "🛞🔋",
  "𝔘𝔫𝔦",
  "x".repeat(5000),
  "__proto__",
  "constructor",
  "toString",
  "<b>bold</b>",
  "' OR 1=1 --",
  "line\nbreak\ttab",
  "\\",
  '"quoted"',
  "İı",
  "ß",
  "नमस्ते",
  "..",
  ".",
  "A.",
  ".1",
];

const ODD_KEYS = ["__proto__", "constructor", "prototype", "", "\u0000", "\ud800", "toString", "hasOwnProperty", "$ref", "format "];

const BAD_REFS = ["NOPE", "NOPE.1", "BAT.9", "purple", "", ".", "X.", ".1", "a".repeat(65), "has space", "ünï", "S1.+.+"];

const BAD_FORMATS = [
  "chainproof/design@2",
  "chainproof/design@0",
  "Chainproof/design@1",
  "",
  "chainproof/verdict@1",
  "chainproof/design@1 ",
  "design",
];

export type MutationKind =
  | "delete"
  | "retype"
  | "number-text"
  | "collide-id"
  | "dangle"
  | "duplicate"
  | "format"
  | "resize"
  | "nest"
  | "unicode"
  | "odd-key"
  | "rename-key"
  | "swap"
  | "relabel"
  | "reverse"
  | "rename-id"
  | "number-edge";

export type Mutation = { kind: MutationKind; at: number; pick: number; size: number };

const KINDS: MutationKind[] = [
  "delete",
  "retype",
  "number-text",
  "collide-id",
  "dangle",
  "duplicate",
  "format",
  "resize",
  "nest",
  "unicode",
  "odd-key",
  "rename-key",
  "swap",
  "relabel",
  "reverse",
  "rename-id",
  "number-edge",
];

/** Numbers at the edges: of PostgreSQL's integer, of exact doubles, signs, fractions. */
const EDGE_NUMBERS = [2 ** 31 - 1, 2 ** 31, -(2 ** 31) - 1, 2 ** 53, 2 ** 53 + 2, 1e21, 1e308, -1, -0, 0.5, 1e-7, 4294967296];

/** Legal ids (spec 1: 1-64 of A-Za-z0-9_-.) that are also names of JavaScript object properties. */
const TRICKY_IDS = ["__proto__", "constructor", "toString", "hasOwnProperty", "valueOf", "prototype", "a.b", "-", "_", "0", "x".repeat(64)];

export const mutationArb: fc.Arbitrary<Mutation> = fc.record({
  kind: fc.constantFrom(...KINDS),
  at: fc.nat(),
  pick: fc.nat(),
  size: fc.nat({ max: 100 }),
});

const choose = <T>(xs: readonly T[], n: number): T | undefined => (xs.length === 0 ? undefined : xs[n % xs.length]);

function nested(depth: number, leaf: Json): Json {
  let v = leaf;
  for (let i = 0; i < depth; i++) v = i % 2 === 0 ? [v] : { all: [v] };
  return v;
}

/** Applies one mutation to `doc` (mutated in place where possible) and returns the result. */
export function applyMutation(doc: Json, m: Mutation): Json {
  const all = pathsOf(doc);
  const inner = all.filter((p) => p.length > 0);
  const where = choose(all, m.at)!;
  const of = (pred: (v: Json, p: Seg[]) => boolean) => all.filter((p) => pred(get(doc, p), p));
  switch (m.kind) {
    case "delete": {
      const p = choose(inner, m.at);
      return p ? remove(doc, p) : doc;
    }
    case "retype": {
      const current = typeOf(get(doc, where));
      const others = ODD_VALUES.filter((v) => typeOf(v) !== current);
      return put(doc, where, cloneJson(choose(others, m.pick)!));
    }
    case "number-text": {
      const p = choose(
        of(
          (v) => typeof v === "number" || typeof v === "boolean" || (typeof v === "string" && v.trim() !== "" && !Number.isNaN(Number(v))),
        ),
        m.at,
      );
      if (!p) return doc;
      const v = get(doc, p);
      return put(doc, p, typeof v === "string" ? Number(v) : String(v));
    }
    case "collide-id": {
      const withId = of((v) => isObj(v) && typeof v.id === "string");
      const target = choose(withId, m.at);
      const source = choose(withId, m.pick);
      if (!target || !source) return doc;
      (get(doc, target) as Obj).id = (get(doc, source) as Obj).id!;
      return doc;
    }
    case "dangle": {
      const p = choose(
        of((v, at) => typeof v === "string" && at.length > 0),
        m.at,
      );
      return p ? put(doc, p, choose(BAD_REFS, m.pick)!) : doc;
    }
    case "duplicate": {
      const p = choose(
        of((v) => Array.isArray(v) && v.length > 0),
        m.at,
      );
      if (!p) return doc;
      const arr = get(doc, p) as Json[];
      const i = m.pick % arr.length;
      arr.splice(i, 0, cloneJson(arr[i]!));
      return doc;
    }
    case "format":
      return isObj(doc) ? (setOwn(doc, "format", choose(BAD_FORMATS, m.pick)!), doc) : doc;
    case "resize": {
      const p = choose(
        of((v) => Array.isArray(v)),
        m.at,
      );
      if (!p) return doc;
      const arr = get(doc, p) as Json[];
      if (m.pick % 3 === 0 || arr.length === 0) return put(doc, p, []);
      // Up to ~6,000 copies: some bodies pass 1 MB (413), most stay below.
      const n = m.size < 90 ? m.size * 2 + 2 : 600 * (m.size - 89);
      return put(
        doc,
        p,
        Array.from({ length: n }, (_, k) => cloneJson(arr[k % arr.length]!)),
      );
    }
    case "nest":
      return put(doc, where, nested(1 + ((m.size * 7 + m.pick) % 140), cloneJson(get(doc, where))));
    case "unicode": {
      const p =
        choose(
          of((v) => typeof v === "string"),
          m.at,
        ) ?? where;
      return put(doc, p, choose(ODD_TEXT, m.pick)!);
    }
    case "odd-key": {
      const p = choose(
        of((v) => isObj(v)),
        m.at,
      );
      if (!p) return doc;
      setOwn(get(doc, p) as Obj, choose(ODD_KEYS, m.pick)!, cloneJson(choose(ODD_VALUES, m.size)!));
      return doc;
    }
    case "rename-key": {
      const p = choose(
        inner.filter((q) => typeof q[q.length - 1] === "string"),
        m.at,
      );
      if (!p) return doc;
      const key = p[p.length - 1] as string;
      const renamed = [key.toUpperCase(), `${key}s`, key.slice(1), `${key}_`, key.replace(/[a-z]/, (c) => c.toUpperCase())][m.pick % 5]!;
      const value = get(doc, p);
      remove(doc, p);
      setOwn(get(doc, p.slice(0, -1)) as Obj, renamed, value);
      return doc;
    }
    case "swap": {
      const p = choose(inner, m.at);
      const q = choose(all, m.pick);
      if (!p || !q || (q.length <= p.length && p.slice(0, q.length).every((s, i) => s === q[i]))) return doc;
      return put(doc, p, cloneJson(get(doc, q)));
    }
    case "relabel": {
      // Usually still valid: a label, a name or a layout position changes.
      const p = choose(
        of(
          (v, at) =>
            (typeof v === "string" && (at.at(-1) === "label" || at.at(-1) === "name" || at.at(-1) === "part")) ||
            (typeof v === "number" && at[0] === "layout"),
        ),
        m.at,
      );
      if (!p) return doc;
      return put(doc, p, typeof get(doc, p) === "number" ? (m.pick % 2000) - 1000 : `Relabelled ${m.pick % 97}`);
    }
    case "number-edge": {
      const p =
        choose(
          of((v) => typeof v === "number"),
          m.at,
        ) ?? where;
      return put(doc, p, choose(EDGE_NUMBERS, m.pick)!);
    }
    case "rename-id": {
      // Still valid unless the new id collides: an id renamed everywhere it is referenced.
      const p = choose(
        of((v) => isObj(v) && typeof v.id === "string"),
        m.at,
      );
      if (!p) return doc;
      const old = (get(doc, p) as Obj).id as string;
      const next = choose(TRICKY_IDS, m.pick)!;
      return renameEverywhere(doc, old, next);
    }
    case "reverse": {
      // Still valid: list order carries no meaning except for conditions (row order) and rules.
      const p = choose(
        of((v) => Array.isArray(v)),
        m.at,
      );
      if (!p) return doc;
      (get(doc, p) as Json[]).reverse();
      return doc;
    }
  }
}

function renameEverywhere(v: Json, old: string, next: string): Json {
  if (typeof v === "string")
    return v === old ? next : v.startsWith(`${old}.`) && !v.slice(old.length + 1).includes(".") ? `${next}${v.slice(old.length)}` : v;
  if (Array.isArray(v)) return v.map((x) => renameEverywhere(x, old, next));
  if (isObj(v)) {
    const out: Obj = {};
    for (const k of Object.keys(v)) setOwn(out, k === old ? next : k, renameEverywhere(v[k]!, old, next));
    return out;
  }
  return v;
}

/** A base design with 1 to `max` mutations (a copy; the bases stay untouched). */
export function mutatedDesign(max = 4): fc.Arbitrary<Json> {
  return fc
    .tuple(fc.nat({ max: BASE_DESIGNS.length - 1 }), fc.array(mutationArb, { minLength: 1, maxLength: max }))
    .map(([base, ms]) => ms.reduce<Json>((doc, m) => applyMutation(doc, m), cloneJson(BASE_DESIGNS[base]!)));
}

/** A request body built around a valid design, with 1 to `max` mutations anywhere in the body. */
export function mutatedBody(wrap: (design: Obj) => Obj, max = 4): fc.Arbitrary<Json> {
  return fc
    .tuple(fc.nat({ max: BASE_DESIGNS.length - 1 }), fc.array(mutationArb, { minLength: 1, maxLength: max }))
    .map(([base, ms]) => ms.reduce<Json>((body, m) => applyMutation(body, m), wrap(cloneJson(BASE_DESIGNS[base]!))));
}

// ---------------------------------------------------------------- raw bodies

export type RawBody = { text: string | Uint8Array; contentType: string };

const CONTENT_TYPES = [
  "application/json",
  "application/json; charset=utf-8",
  "application/vnd.chainproof+json",
  "text/plain",
  "application/x-www-form-urlencoded",
  "",
];

/** Bodies that are not a JSON object: any JSON, any text, any bytes, cut-off JSON, other content types. */
export function rawBodyArb(validBody: Json): fc.Arbitrary<RawBody> {
  const json = "application/json";
  const full = JSON.stringify(validBody);
  return fc.oneof(
    fc.jsonValue({ maxDepth: 4 }).map((v) => ({ text: JSON.stringify(v) ?? "null", contentType: json })),
    fc.string({ unit: "binary", maxLength: 200 }).map((text) => ({ text, contentType: json })),
    fc.uint8Array({ maxLength: 300 }).map((text) => ({ text, contentType: json })),
    fc.nat({ max: full.length }).map((n) => ({ text: full.slice(0, n), contentType: json })),
    fc.constantFrom(...CONTENT_TYPES).map((contentType) => ({ text: full, contentType })),
    fc
      .constantFrom(
        "",
        " ",
        "\n",
        "{",
        "}",
        "[",
        "null",
        "[]",
        "{}",
        '{"document":}',
        "\ufeff{}",
        '{"document": NaN}',
        "1e999",
        '{"a":1,"a":2}',
      )
      .map((text) => ({ text, contentType: json })),
  );
}

// ---------------------------------------------------------------- field paths

/**
 * Whether `path` (the engine's formatPath form, e.g. `components[3].closedIn[0]`, `layout.S 1.x`;
 * "" or "(root)" for the value itself) names a place in `value`: every step exists, except that the
 * last may be a key missing from an existing object (a required field that is absent).
 */
export function pathNamesPlaceIn(value: unknown, path: string): boolean {
  if (path === "" || path === "(root)") return true;
  return walk(value, path, true);
}

function walk(v: unknown, rest: string, first: boolean): boolean {
  if (rest === "") return true;
  if (rest.startsWith("[")) {
    const m = /^\[(\d+)\]/.exec(rest);
    if (!m || !Array.isArray(v)) return false;
    const i = Number(m[1]);
    return i < v.length && walk(v[i], rest.slice(m[0].length), false);
  }
  let body: string;
  if (first) body = rest;
  else if (rest.startsWith(".")) body = rest.slice(1);
  else return false;
  if (!isObj(v)) return false;
  // Keys may hold dots or brackets themselves: try every key the text starts with, longest first.
  const keys = Object.keys(v)
    .filter((k) => body.startsWith(k) && [undefined, ".", "["].includes(body[k.length]))
    .sort((a, b) => b.length - a.length);
  for (const k of keys) if (walk(v[k], body.slice(k.length), false)) return true;
  return /^[^.[]+$/.test(body) && !Object.hasOwn(v, body);
}
