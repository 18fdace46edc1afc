// The editor's first paint stays within its budget of compressed JavaScript (issue 12: at most 300 kB).
// A size check of the production build the suite has just made, not a timing: what the browser
// really transfers, and how fast the canvas becomes usable, are measured by `npm run bench`
// (test/bench/canvas-bench.ts) and recorded in README.md.
import { existsSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { editorFirstPaint } from "../support/editor-weight";

const BUDGET_BYTES = 300_000;

describe("editor JavaScript budget", () => {
  it("the build exists (npm test builds it before the integration tests)", () => {
    expect(existsSync("build/client/assets")).toBe(true);
  });

  it("the editor route's first paint downloads at most 300 kB of gzip-compressed JavaScript", () => {
    const { chunks, gzip } = editorFirstPaint();
    const listing = chunks.map((c) => `${(c.gzip / 1000).toFixed(1)} kB ${c.file} (${c.why})`).join("\n");
    expect(gzip, `first paint of the editor:\n${listing}`).toBeLessThanOrEqual(BUDGET_BYTES);
  });

  it("counts the canvas and the live proof's worker, and leaves out what loads on use", () => {
    const files = editorFirstPaint().chunks.map((c) => c.file);
    expect(files.some((f) => /^entry\.client-/.test(f))).toBe(true);
    expect(files.some((f) => /^editor-/.test(f))).toBe(true);
    expect(files.some((f) => /^proof\.worker-/.test(f))).toBe(true);
    // elkjs (in the layout worker), the validator and the panels are loaded when used (decision 143),
    // and the API client with its schemas on the first save (decision 144).
    for (const onUse of [/^elk\.bundled-/, /^layout\.worker-/, /^simulate-panel-/, /^rules-panel-/, /^client-/, /^schemas-/])
      expect(files.filter((f) => onUse.test(f))).toEqual([]);
  });
});
