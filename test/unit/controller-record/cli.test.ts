// `chainproof check-controller`, run as a separate process (controller-record.md section 5).
import { spawnSync } from "node:child_process";
import { readFileSync, writeFileSync, mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { checkRecord, parseRecord } from "../../../app/controller-record";
import { validateDesign } from "../../../app/engine";
import { exampleRecord, withValue } from "./fixtures";

const EXAMPLES = "/work/shared/spec/examples";
const FIXTURES = "test/unit/controller-record/fixtures";
const SLOW = 60_000;

function run(...args: string[]) {
  const r = spawnSync(process.execPath, ["--import", "tsx", "app/cli/chainproof.ts", "check-controller", ...args], {
    encoding: "utf8",
    cwd: process.cwd(),
  });
  return { code: r.status, out: r.stdout, err: r.stderr };
}
const noStackTrace = (text: string) => expect(text).not.toMatch(/^\s+at .+:\d+/m);
const tmp = mkdtempSync(path.join(tmpdir(), "check-controller-"));
function file(name: string, json: unknown): string {
  const p = path.join(tmp, name);
  writeFileSync(p, JSON.stringify(json));
  return p;
}

describe("chainproof check-controller", () => {
  it(
    "prints chainproof/controller-check@1 and exits 0 with only a warning",
    () => {
      const r = run(`${FIXTURES}/example.record.json`);
      expect(r.code).toBe(0);
      const out = JSON.parse(r.out);
      expect(Object.keys(out)).toEqual(["format", "derived", "findings"]);
      expect(out.format).toBe("chainproof/controller-check@1");
      expect(out.derived.pack).toEqual({ minV: 40, nominalV: 51.2, maxV: 58.4 });
      expect(out.findings.map((f: { code: string }) => f.code)).toEqual(["battery-current-above-pack"]);
    },
    SLOW,
  );

  it(
    "exits 0 against a design whose assumed lockouts the record has (deck mower: power-on, enable-restore)",
    () => {
      const r = run(`${FIXTURES}/example.record.json`, "--design", `${EXAMPLES}/deck-mower.design.json`);
      expect(r.code).toBe(0);
    },
    SLOW,
  );

  it(
    "exits 1 against a design assuming lockouts the record lacks, listing them in the design's order",
    () => {
      const r = run(`${FIXTURES}/example.record.json`, "--design", `${EXAMPLES}/campus-hauler.design.json`);
      expect(r.code).toBe(1);
      const out = JSON.parse(r.out);
      const design = validateDesign(JSON.parse(readFileSync(`${EXAMPLES}/campus-hauler.design.json`, "utf8")));
      const record = parseRecord(JSON.parse(readFileSync(`${FIXTURES}/example.record.json`, "utf8")));
      if (!design.ok || !record.ok) throw new Error("fixtures should be valid");
      expect(out).toEqual(JSON.parse(JSON.stringify(checkRecord(record.record, design.design))));
      expect(out.findings.slice(0, 2).map((f: { message: string }) => f.message.match(/the (\S+) lockout/)?.[1])).toEqual([
        "brake-release",
        "throttle-fault",
      ]);
    },
    SLOW,
  );

  it(
    "exits 1 on a record with an error finding of its own",
    () => {
      const r = run(file("low-cutback.json", withValue(exampleRecord(), "settings.lowVoltageCutbackV", 36)));
      expect(r.code).toBe(1);
      expect(JSON.parse(r.out).findings[0]).toMatchObject({ code: "cutback-below-pack-min", severity: "error" });
    },
    SLOW,
  );

  it(
    "exits 2 on an invalid record: nothing on stdout, every problem on stderr with its path",
    () => {
      const r = run(`${FIXTURES}/invalid.record.json`);
      expect(r.code).toBe(2);
      expect(r.out).toBe("");
      noStackTrace(r.err);
      const [head, ...lines] = r.err.trimEnd().split("\n");
      expect(head).toMatch(/invalid\.record\.json is not a valid controller settings record/);
      expect(lines.map((l) => l.slice(0, l.indexOf(": ")))).toEqual([
        "pack.chemistry",
        "pack.capacityAh",
        "settings.batteryCurrentPercent",
        "settings.lockouts[1]",
        "settings.throttle.restV",
      ]);
    },
    SLOW,
  );

  it(
    "exits 2 on an invalid design, naming its problems by path",
    () => {
      const r = run(`${FIXTURES}/example.record.json`, "--design", "test/unit/engine/fixtures/invalid.design.json");
      expect(r.code).toBe(2);
      expect(r.out).toBe("");
      noStackTrace(r.err);
      expect(r.err).toMatch(/is not a valid design:\n/);
      expect(r.err).toContain('components[2].closedIn[0]: state "running" is not a state of condition "kill"');
    },
    SLOW,
  );

  it(
    "exits 2 with one line on a missing file, bad JSON or bad usage",
    () => {
      for (const args of [
        [`${FIXTURES}/missing.record.json`],
        ["test/unit/engine/fixtures/not-json.design.json"],
        [],
        ["a", "b"],
        [`${FIXTURES}/example.record.json`, "--desing", "x"],
      ]) {
        const r = run(...args);
        expect(r.code).toBe(2);
        noStackTrace(r.err);
        expect(r.err.split("\n")[0]).toMatch(/^chainproof: /);
      }
    },
    SLOW,
  );

  it(
    "explains itself with --help, including that the record is not what the controller holds",
    () => {
      const r = run("--help");
      expect(r.code).toBe(0);
      expect(r.out).toMatch(/verify on the vehicle/);
    },
    SLOW,
  );
});
