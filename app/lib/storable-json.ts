// What PostgreSQL can store as it is: text without the NUL character or an unpaired surrogate (which
// has no UTF-8 form), and JSON nested no deeper than the server walks. Pure: the forms (browser) and
// the domain (server) both check with it.
import type { FieldProblem } from "~/designs/types";

const MAX_DEPTH = 64;
// eslint-disable-next-line no-control-regex -- finding control characters is what this pattern is for
const UNSTORABLE_TEXT = /\u0000|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;

/** Text PostgreSQL stores as it is. */
export const storableText = (s: string): boolean => !UNSTORABLE_TEXT.test(s);

/**
 * Whether a parsed JSON value can be stored in a jsonb column as it is: PostgreSQL refuses the NUL
 * character and unpaired surrogates in text, and very deep nesting is refused here as well.
 * Returns the first problem, its path starting at `root`.
 */
export function storableJsonProblem(value: unknown, root: string): FieldProblem | null {
  const stack: Array<{ v: unknown; path: string; depth: number }> = [{ v: value, path: root, depth: 0 }];
  const badText = (s: string) => !storableText(s);
  while (stack.length > 0) {
    const { v, path, depth } = stack.pop()!;
    if (depth > MAX_DEPTH) return { path, message: `nesting deeper than ${MAX_DEPTH} levels` };
    if (typeof v === "string") {
      if (badText(v)) return { path, message: "text with a NUL character or a broken surrogate pair" };
    } else if (Array.isArray(v)) {
      v.forEach((x, i) => stack.push({ v: x, path: `${path}[${i}]`, depth: depth + 1 }));
    } else if (v !== null && typeof v === "object") {
      for (const [k, x] of Object.entries(v)) {
        const p = path ? `${path}.${k}` : k;
        if (badText(k)) return { path: p, message: "a key with a NUL character or a broken surrogate pair" };
        stack.push({ v: x, path: p, depth: depth + 1 });
      }
    }
  }
  return null;
}
