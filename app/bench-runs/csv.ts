// A bench run as CSV: a caution line, a blank line, then one line per step. Written through the
// engine's CSV writer (formula cells neutralised, decision 101's rule for every CSV).
import { z } from "zod";
import { csvLine } from "~/engine";
import type { runSchema } from "~/api/answers";
import { ISOLATE_FIRST, SAFETY_TEXT } from "~/lib/safety";

export const BENCH_CSV_COLUMNS = [
  "step",
  "kind",
  "instruction",
  "conditions",
  "expected drive",
  "expected live",
  "expected dead",
  "result",
  "note",
  "photos",
  "recorded by",
  "recorded at",
];

export function benchRunCsv(run: z.input<typeof runSchema>): string {
  const lines = [csvLine(["Caution", `${ISOLATE_FIRST} ${SAFETY_TEXT}`]), "\n", csvLine(BENCH_CSV_COLUMNS)];
  for (const s of run.steps) {
    const inputs = Object.entries(s.expect.inputs);
    lines.push(
      csvLine([
        String(s.n),
        s.kind,
        s.instruction,
        Object.entries(s.set)
          .map(([k, v]) => `${k}=${v}`)
          .join("; "),
        s.expect.drive ? "runs" : "stays off",
        inputs
          .filter(([, on]) => on)
          .map(([id]) => id)
          .join(" "),
        inputs
          .filter(([, on]) => !on)
          .map(([id]) => id)
          .join(" "),
        s.status ?? "",
        s.note,
        s.photos.map((p) => p.filename).join("; "),
        s.updatedBy?.name ?? "",
        s.updatedAt ?? "",
      ]),
    );
  }
  return lines.join("");
}
