// Rule predicates evaluated on 32 rows at once: each literal is a 32-bit word of rows.
import type { CompiledPredicate } from "./compile";

/** Returns the rows (bits of one word) where the predicate holds, given the literal words. */
export type WordPredicate = (lit: Int32Array) => number;

export function predicateWord(p: CompiledPredicate): WordPredicate {
  switch (p.k) {
    case "true":
      return () => -1;
    case "lit": {
      const i = p.lit;
      return (lit) => lit[i];
    }
    case "not": {
      const f = predicateWord(p.item);
      return (lit) => ~f(lit);
    }
    case "all": {
      const fs = p.items.map(predicateWord);
      if (fs.length === 0) return () => -1;
      if (fs.length === 1) return fs[0];
      return (lit) => {
        let w = -1;
        for (let k = 0; k < fs.length && w !== 0; k++) w &= fs[k](lit);
        return w;
      };
    }
    case "any": {
      const fs = p.items.map(predicateWord);
      if (fs.length === 0) return () => 0;
      if (fs.length === 1) return fs[0];
      return (lit) => {
        let w = 0;
        for (let k = 0; k < fs.length && w !== -1; k++) w |= fs[k](lit);
        return w;
      };
    }
  }
}

/** Literal indexes a predicate reads. */
export function predicateLiterals(p: CompiledPredicate, out: Set<number> = new Set()): Set<number> {
  if (p.k === "lit") out.add(p.lit);
  else if (p.k === "not") predicateLiterals(p.item, out);
  else if (p.k === "all" || p.k === "any") for (const q of p.items) predicateLiterals(q, out);
  return out;
}
