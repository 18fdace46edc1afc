// The verdict document (spec section 2).
import { compileDesign, type CompiledDesign } from "./compile";
import { decodeRow } from "./rows";
import { summarizeTable } from "./rules";
import type { Design, RuleVerdict, Verdict } from "./schema";
import { VERDICT_FORMAT } from "./schema";
import { shortestRestart } from "./sequence";

export function isCompiled(d: Design | CompiledDesign): d is CompiledDesign {
  return (d as CompiledDesign).kind === "chainproof/compiled@1";
}

export function prove(input: Design | CompiledDesign): Verdict {
  const c = isCompiled(input) ? input : compileDesign(input);
  const summary = summarizeTable(c, { faults: true });
  const rules: RuleVerdict[] = [];
  let restartTrace: number[] | null | undefined;
  for (const r of c.rules) {
    if (r.type === "inhibit") {
      const count = summary.inhibit[r.index]!;
      const holds = count.violating === 0;
      rules.push({
        id: r.id,
        holds,
        unsafeRows: count.unsafe,
        violatingRows: count.violating,
        ...(holds ? {} : { example: decodeRow(c, count.example) }),
      });
    } else if (r.type === "require-drive") {
      const count = summary.requireDrive[r.index]!;
      const holds = count.failing === 0;
      rules.push({
        id: r.id,
        holds,
        demandRows: count.demand,
        failingRows: count.failing,
        ...(holds ? {} : { example: decodeRow(c, count.example) }),
      });
    } else {
      if (restartTrace === undefined) restartTrace = shortestRestart(c, summary.views);
      rules.push(
        restartTrace === null ? { id: r.id, holds: true } : { id: r.id, holds: false, trace: restartTrace.map((row) => decodeRow(c, row)) },
      );
    }
  }
  return {
    format: VERDICT_FORMAT,
    // Spec 2 (version 1.1): a design that never drives satisfies every inhibit rule and proves nothing.
    ok: rules.every((r) => r.holds) && summary.driveRows > 0,
    rows: c.rows,
    driveRows: summary.driveRows,
    rules,
    singleFaults: summary.singleFaults ?? [],
  };
}
