// Does a rule's `when` hold in at least one row? (Spec 1.6, version 1.1: a rule that matches no row
// says nothing and makes the design invalid.) Only the conditions the predicate names matter, so
// this enumerates the table of those conditions alone, 32 rows a word, and stops at the first
// matching word: a satisfiable `when` usually answers in one word, an empty one costs a scan of the
// named conditions' combinations (never more than the design's own table).
import type { CompiledPredicate, Literal } from "./compile";
import { predicateWord } from "./predicate";
import type { Predicate } from "./schema";
import { LiteralSource, WORD } from "./table";

/**
 * `statesOf(id)` gives a condition's distinct states; the predicate must name only known conditions
 * and states, and the table must be within the engine's limit (validate.ts checks both first).
 */
export function predicateMatchesSomeRow(p: Predicate, statesOf: (condId: string) => readonly string[]): boolean {
  const named: string[] = [];
  const at = new Map<string, number>();
  const literals: Literal[] = [];
  const compile = (q: Predicate): CompiledPredicate => {
    if ("cond" in q) {
      let cond = at.get(q.cond);
      if (cond === undefined) {
        cond = named.length;
        at.set(q.cond, cond);
        named.push(q.cond);
      }
      const states = statesOf(q.cond);
      let mask = 0;
      for (const s of q.in) mask |= 1 << states.indexOf(s);
      literals.push({ cond, mask });
      return { k: "lit", lit: literals.length - 1 };
    }
    if ("all" in q) return { k: "all", items: q.all.map(compile) };
    if ("any" in q) return { k: "any", items: q.any.map(compile) };
    if ("not" in q) return { k: "not", item: compile(q.not) };
    return { k: "true" };
  };
  const f = predicateWord(compile(p));
  // Mixed radix over the named conditions, the last named varying fastest.
  const conditions = named.map((id) => ({ stride: 1, radix: statesOf(id).length }));
  let rows = 1;
  for (let i = conditions.length - 1; i >= 0; i--) {
    conditions[i].stride = rows;
    rows *= conditions[i].radix;
  }
  const source = new LiteralSource(conditions, literals);
  const words = Math.ceil(rows / WORD);
  const rem = rows % WORD;
  for (let w = 0; w < words; w++) {
    source.load(w);
    const valid = w === words - 1 && rem !== 0 ? (1 << rem) - 1 : -1;
    if ((f(source.words) & valid) !== 0) return true;
  }
  return false;
}
