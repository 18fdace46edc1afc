// Reading a stored revision back: one function validates it with the engine and gives the engine's
// Design; a document damaged in storage is refused with the revision's name, never cast through.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { validateDesign } from "~/engine";
import { DamagedRevisionError, readRevisionDesign } from "~/designs/revision-document";

const stored = JSON.parse(
  readFileSync(new URL("../../../drizzle/demo-designs/haybarn-campus-hauler.json", import.meta.url), "utf8"),
) as unknown;

describe("readRevisionDesign", () => {
  it("gives the design the engine's own validation gives for a stored document", () => {
    const valid = validateDesign(stored);
    expect(valid.ok).toBe(true);
    if (!valid.ok) return;
    expect(readRevisionDesign(stored, "rev-1")).toEqual(valid.design);
  });

  it("refuses a damaged document, naming the revision and the first problem", () => {
    const damaged = structuredClone(stored) as { conditions: unknown };
    damaged.conditions = "not a list";
    expect(() => readRevisionDesign(damaged, "rev-7")).toThrow(DamagedRevisionError);
    expect(() => readRevisionDesign(damaged, "rev-7")).toThrow(/revision rev-7 .*conditions/);
    expect(() => readRevisionDesign(null, "rev-8")).toThrow(/revision rev-8/);
  });
});
