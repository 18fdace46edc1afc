// The command line, run as a separate process on the shared examples and on broken inputs.
import { spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { validateDesign } from "../../../app/engine";

const EXAMPLES = "/work/shared/spec/examples";
const FIXTURES = "test/unit/engine/fixtures";
const SLOW = 60_000;

function run(...args: string[]) {
  const r = spawnSync(process.execPath, ["--import", "tsx", "app/cli/chainproof.ts", ...args], {
    encoding: "utf8",
    cwd: process.cwd(),
  });
  return { code: r.status, out: r.stdout, err: r.stderr };
}
const noStackTrace = (text: string) => expect(text).not.toMatch(/^\s+at .+:\d+/m);

describe("chainproof prove", () => {
  it("prints the verdict and exits 1 when a rule fails", () => {
    const r = run("prove", `${EXAMPLES}/deck-mower.design.json`);
    expect(r.code).toBe(1);
    const verdict = JSON.parse(r.out);
    expect(verdict).toMatchObject({ format: "chainproof/verdict@1", ok: false, rows: 16, driveRows: 3 });
    expect(r.out).toContain('\n  "ok": false,');
  }, SLOW);

  it("exits 0 when every rule holds", () => {
    const r = run("prove", `${EXAMPLES}/campus-hauler.design.json`);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out).ok).toBe(true);
  }, SLOW);

  it("exits 2 on an invalid design with one problem per stderr line, each starting with its path", () => {
    const r = run("prove", `${FIXTURES}/invalid.design.json`);
    expect(r.code).toBe(2);
    expect(r.out).toBe("");
    noStackTrace(r.err);
    const lines = r.err.trimEnd().split("\n");
    const checked = validateDesign(JSON.parse(readFileSync(`${FIXTURES}/invalid.design.json`, "utf8")));
    if (checked.ok) throw new Error("fixture should be invalid");
    expect(lines.map((l) => l.slice(0, l.indexOf(": ")))).toEqual(checked.problems.map((p) => p.path));
    expect(lines).toContain('components[2].closedIn[0]: state "running" is not a state of condition "kill"');
  }, SLOW);

  it("exits 2 with a one-line message on a missing file and on a file that is not JSON", () => {
    for (const file of [`${FIXTURES}/missing.design.json`, `${FIXTURES}/not-json.design.json`]) {
      const r = run("prove", file);
      expect(r.code).toBe(2);
      noStackTrace(r.err);
      expect(r.err.split("\n")[0]).toMatch(/^chainproof: .*(no such file|not valid JSON)/);
    }
  }, SLOW);
});

describe("chainproof table", () => {
  it("streams CSV with a header and one line per row", () => {
    const r = run("table", `${EXAMPLES}/trail-bike.design.json`, "--csv");
    expect(r.code).toBe(0);
    const lines = r.out.trimEnd().split("\n");
    expect(lines[0].startsWith("row,key,kill,stand,grip,")).toBe(true);
    expect(lines).toHaveLength(1 + 24);
  }, SLOW);

  it("filters and limits rows in the text table", () => {
    const r = run("table", `${EXAMPLES}/campus-hauler.design.json`, "--only", "unsafe", "--rule", "neutral", "--from", "2", "--count", "5");
    expect(r.code).toBe(0);
    const lines = r.out.trimEnd().split("\n");
    expect(lines).toHaveLength(6);
    expect(lines[0]).toMatch(/^row\s+key\s+seat/);
    expect(lines.slice(1).every((l) => / neutral /.test(l))).toBe(true);
  }, SLOW);

  it("rejects a bad flag with exit 2", () => {
    const r = run("table", `${EXAMPLES}/trail-bike.design.json`, "--only", "sometimes");
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/--only must be unsafe, violating or drive/);
    noStackTrace(r.err);
  }, SLOW);
});

describe("chainproof diagnose", () => {
  it("prints a JSON diagnosis for a row", () => {
    const r = run("diagnose", `${EXAMPLES}/trail-bike.design.json`, "--row", "key=on,kill=stop,stand=up,grip=open");
    expect(r.code).toBe(0);
    const d = JSON.parse(r.out);
    expect(d.drive).toBe(false);
    expect(d.reasons.map((x: { code: string }) => x.code)).toEqual(["not-enabled"]);
    expect(d.inputs[1].fixes[0][0]).toMatchObject({ contact: "KL", closeIn: ["run"] });
  }, SLOW);

  it("names the conditions missing from --row and exits 2", () => {
    const r = run("diagnose", `${EXAMPLES}/trail-bike.design.json`, "--row", "key=on,grip=open", "--text");
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/no state given for conditions kill, stand/);
  }, SLOW);

  it("explains itself with --help", () => {
    const r = run("diagnose", "--help");
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/--row COND=STATE/);
  }, SLOW);
});
