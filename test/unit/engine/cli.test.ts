// The command line, run as a separate process on the shared examples and on broken inputs.
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
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
  it(
    "prints the verdict and exits 1 when a rule fails",
    () => {
      const r = run("prove", `${EXAMPLES}/deck-mower.design.json`);
      expect(r.code).toBe(1);
      const verdict = JSON.parse(r.out);
      expect(verdict).toMatchObject({ format: "chainproof/verdict@1", ok: false, rows: 16, driveRows: 3 });
      expect(r.out).toContain('\n  "ok": false,');
    },
    SLOW,
  );

  it(
    "exits 0 when every rule holds",
    () => {
      const r = run("prove", `${EXAMPLES}/campus-hauler.design.json`);
      expect(r.code).toBe(0);
      expect(JSON.parse(r.out).ok).toBe(true);
    },
    SLOW,
  );

  it(
    "exits 2 on an invalid design with one problem per stderr line, each starting with its path",
    () => {
      const r = run("prove", `${FIXTURES}/invalid.design.json`);
      expect(r.code).toBe(2);
      expect(r.out).toBe("");
      noStackTrace(r.err);
      const lines = r.err.trimEnd().split("\n");
      const checked = validateDesign(JSON.parse(readFileSync(`${FIXTURES}/invalid.design.json`, "utf8")));
      if (checked.ok) throw new Error("fixture should be invalid");
      expect(lines.map((l) => l.slice(0, l.indexOf(": ")))).toEqual(checked.problems.map((p) => p.path));
      expect(lines).toContain('components[2].closedIn[0]: state "running" is not a state of condition "kill"');
    },
    SLOW,
  );

  it(
    "exits 2 with a one-line message on a missing file and on a file that is not JSON",
    () => {
      for (const file of [`${FIXTURES}/missing.design.json`, `${FIXTURES}/not-json.design.json`]) {
        const r = run("prove", file);
        expect(r.code).toBe(2);
        noStackTrace(r.err);
        expect(r.err.split("\n")[0]).toMatch(/^chainproof: .*(no such file|not valid JSON)/);
      }
    },
    SLOW,
  );
});

/** The yard-tug example changed by `edit`, written to a temporary file. */
function yardTugFile(edit: (d: Record<string, any>) => void): string {
  const d = JSON.parse(readFileSync(`${EXAMPLES}/yard-tug.design.json`, "utf8"));
  edit(d);
  const file = join(mkdtempSync(join(tmpdir(), "chainproof-cli-")), "design.json");
  writeFileSync(file, JSON.stringify(d));
  return file;
}

describe("chainproof prove, spec 1.1", () => {
  it(
    "gives require-drive rules their demand and failing counts",
    () => {
      const r = run("prove", `${EXAMPLES}/yard-tug.design.json`);
      expect(r.code).toBe(1); // N1 fails in the example
      const verdict = JSON.parse(r.out);
      expect(verdict.rules.find((x: { id: string }) => x.id === "D1")).toEqual({ id: "D1", holds: true, demandRows: 2, failingRows: 0 });
      expect(r.err).toMatch(/1 of 4 rules fail: N1/);
    },
    SLOW,
  );

  it(
    "exits 2 with the path for a rule whose when matches no row",
    () => {
      const file = yardTugFile((d) => {
        d.rules[2].when = {
          all: [
            { cond: "key", in: ["on"] },
            { cond: "key", in: ["off"] },
          ],
        };
      });
      const r = run("prove", file);
      expect(r.code).toBe(2);
      expect(r.out).toBe("");
      noStackTrace(r.err);
      expect(r.err.trimEnd().split("\n")).toEqual([expect.stringMatching(/^rules\[2\]\.when: "when" holds in no row/)]);
    },
    SLOW,
  );

  it(
    "exits 1 for a design that never drives, though every rule holds, and says so",
    () => {
      const file = yardTugFile((d) => {
        d.rules = d.rules.filter((x: { type: string }) => x.type === "inhibit");
        d.wires = d.wires.filter((w: { to: string }) => w.to !== "EN.in");
      });
      const r = run("prove", file);
      expect(r.code).toBe(1);
      const verdict = JSON.parse(r.out);
      expect(verdict).toMatchObject({ ok: false, driveRows: 0 });
      expect(verdict.rules.every((x: { holds: boolean }) => x.holds)).toBe(true);
      expect(r.err).toMatch(/never drives/);
    },
    SLOW,
  );

  it(
    "exits 0 only when every rule holds and the design drives",
    () => {
      const file = yardTugFile((d) => {
        d.controller.lockouts = ["power-on", "enable-restore", "direction-engage", "brake-release", "throttle-fault"];
      });
      const r = run("prove", file);
      expect(JSON.parse(r.out)).toMatchObject({ ok: true, driveRows: 2 });
      expect(r.code).toBe(0);
      expect(r.err).toBe("");
    },
    SLOW,
  );
});

describe("chainproof table", () => {
  it(
    "lists a require-drive rule's failing rows",
    () => {
      const file = yardTugFile((d) => {
        d.components.find((x: { id: string }) => x.id === "SEAT").closedIn = ["empty"];
      });
      const r = run("table", file, "--csv", "--only", "failing", "--rule", "D1");
      expect(r.code).toBe(0);
      const lines = r.out.trimEnd().split("\n");
      expect(lines[0].endsWith(",rule:R1,rule:R2,rule:D1")).toBe(true);
      expect(lines.slice(1).map((l) => l.split(",").at(-1))).toEqual(["failing", "failing"]);
      const wrong = run("table", file, "--only", "failing", "--rule", "R1");
      expect(wrong.code).toBe(2);
      expect(wrong.err).toMatch(/"R1" is not a require-drive rule/);
    },
    SLOW,
  );

  it(
    "streams CSV with a header and one line per row",
    () => {
      const r = run("table", `${EXAMPLES}/trail-bike.design.json`, "--csv");
      expect(r.code).toBe(0);
      const lines = r.out.trimEnd().split("\n");
      expect(lines[0].startsWith("row,key,kill,stand,grip,")).toBe(true);
      expect(lines).toHaveLength(1 + 24);
    },
    SLOW,
  );

  it(
    "filters and limits rows in the text table",
    () => {
      const r = run(
        "table",
        `${EXAMPLES}/campus-hauler.design.json`,
        "--only",
        "unsafe",
        "--rule",
        "neutral",
        "--from",
        "2",
        "--count",
        "5",
      );
      expect(r.code).toBe(0);
      const lines = r.out.trimEnd().split("\n");
      expect(lines).toHaveLength(6);
      expect(lines[0]).toMatch(/^row\s+key\s+seat/);
      expect(lines.slice(1).every((l) => / neutral /.test(l))).toBe(true);
    },
    SLOW,
  );

  it(
    "rejects a bad flag with exit 2",
    () => {
      const r = run("table", `${EXAMPLES}/trail-bike.design.json`, "--only", "sometimes");
      expect(r.code).toBe(2);
      expect(r.err).toMatch(/--only must be unsafe, violating, drive, demand or failing/);
      noStackTrace(r.err);
    },
    SLOW,
  );
});

describe("chainproof diagnose", () => {
  it(
    "prints a JSON diagnosis for a row",
    () => {
      const r = run("diagnose", `${EXAMPLES}/trail-bike.design.json`, "--row", "key=on,kill=stop,stand=up,grip=open");
      expect(r.code).toBe(0);
      const d = JSON.parse(r.out);
      expect(d.drive).toBe(false);
      expect(d.reasons.map((x: { code: string }) => x.code)).toEqual(["not-enabled"]);
      expect(d.inputs[1].fixes[0][0]).toMatchObject({ contact: "KL", closeIn: ["run"] });
    },
    SLOW,
  );

  it(
    "names the conditions missing from --row and exits 2",
    () => {
      const r = run("diagnose", `${EXAMPLES}/trail-bike.design.json`, "--row", "key=on,grip=open", "--text");
      expect(r.code).toBe(2);
      expect(r.err).toMatch(/no state given for conditions kill, stand/);
    },
    SLOW,
  );

  it(
    "explains itself with --help",
    () => {
      const r = run("diagnose", "--help");
      expect(r.code).toBe(0);
      expect(r.out).toMatch(/--row COND=STATE/);
    },
    SLOW,
  );
});
