// `chainproof groups` and `chainproof why`, run as separate processes: the spec's JSON on stdout with
// exit 0, and exit 2 with a one-line message for invalid designs and sets or rules that cannot be used.
import { spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import type { Design, RowGroup } from "../../../app/engine";

const EXAMPLES = "/work/shared/spec/examples";
const FIXTURES = "test/unit/engine/fixtures";
const SLOW = 60_000;

function run(...args: string[]) {
  const r = spawnSync(process.execPath, ["--import", "tsx", "app/cli/chainproof.ts", ...args], { encoding: "utf8", cwd: process.cwd() });
  return { code: r.status, out: r.stdout, err: r.stderr };
}
const noStackTrace = (text: string) => expect(text).not.toMatch(/^\s+at .+:\d+/m);

const YARD_TUG = `${EXAMPLES}/yard-tug.design.json`;
const yardTug = JSON.parse(readFileSync(YARD_TUG, "utf8")) as Design;

/** Rows a group stands for, as sorted "state,state,..." strings. */
const rowsOf = (groups: RowGroup[]) =>
  groups
    .flatMap((g) =>
      yardTug.conditions.reduce<string[][]>((acc, c) => acc.flatMap((row) => (g.states[c.id] ?? c.states).map((s) => [...row, s])), [[]]),
    )
    .map((r) => r.join(","))
    .sort();

describe("chainproof groups", () => {
  it(
    "prints the groups of the drive rows: the example's rows in no more groups, exit 0",
    () => {
      const r = run("groups", YARD_TUG, "--set", "drive");
      expect(r.code).toBe(0);
      const doc = JSON.parse(r.out);
      const example = JSON.parse(readFileSync(`${EXAMPLES}/yard-tug.groups-drive.json`, "utf8"));
      expect(doc).toMatchObject({ format: "chainproof/groups@1", set: "drive", rows: example.rows });
      expect(doc.groups.length).toBeLessThanOrEqual(example.groups.length);
      expect(rowsOf(doc.groups)).toEqual(rowsOf(example.groups));
    },
    SLOW,
  );

  it(
    "prints the rows a stuck contact breaks",
    () => {
      const r = run("groups", YARD_TUG, "--set", "broken:SEAT/stuck-closed");
      expect(r.code).toBe(0);
      const doc = JSON.parse(r.out);
      expect(doc.rows).toBe(2);
      expect(doc.groups[0].states).toMatchObject({ seat: ["empty"], plug: ["free"], thr: ["pressed"] });
    },
    SLOW,
  );

  it.each([
    ["unsafe:R9", 'no rule with id "R9"'],
    ["unsafe:N1", "needs an inhibit rule"],
    ["failing:R1", "needs a require-drive rule"],
    ["broken:J1/stuck-open", "not a contact"],
    ["broken:KEY/melted", 'unknown mode "melted"'],
    ["sideways", "unknown set"],
  ])(
    "exits 2 with a one-line message for --set %s",
    (set, message) => {
      const r = run("groups", YARD_TUG, "--set", set);
      expect(r.code).toBe(2);
      expect(r.out).toBe("");
      noStackTrace(r.err);
      expect(r.err.split("\n")[0]).toContain(message);
    },
    SLOW,
  );

  it(
    "exits 2 for an invalid design and without --set",
    () => {
      const invalid = run("groups", `${FIXTURES}/invalid.design.json`, "--set", "drive");
      expect(invalid.code).toBe(2);
      expect(invalid.out).toBe("");
      expect(invalid.err).toContain("components[2].closedIn[0]");
      const missing = run("groups", YARD_TUG);
      expect(missing.code).toBe(2);
      expect(missing.err).toContain("--set");
    },
    SLOW,
  );
});

describe("chainproof why", () => {
  it(
    "prints why R1 holds: the example's reasons and rows, exit 0",
    () => {
      const r = run("why", YARD_TUG, "--rule", "R1");
      expect(r.code).toBe(0);
      const doc = JSON.parse(r.out);
      const example = JSON.parse(readFileSync(`${EXAMPLES}/yard-tug.why-R1.json`, "utf8"));
      expect(doc).toMatchObject({ format: "chainproof/why@1", rule: "R1", unsafeRows: example.unsafeRows });
      expect(doc.reasons.map((p: { reason: string; rows: number }) => [p.reason, p.rows])).toEqual(
        example.reasons.map((p: { reason: string; rows: number }) => [p.reason, p.rows]),
      );
      doc.reasons.forEach((p: { groups: RowGroup[] }, k: number) => expect(rowsOf(p.groups)).toEqual(rowsOf(example.reasons[k].groups)));
    },
    SLOW,
  );

  it(
    "exits 2 for an unknown rule and for a rule that is not an inhibit rule forbidding drive",
    () => {
      for (const [rule, message] of [
        ["R9", 'no rule with id "R9"'],
        ["N1", "no-restart rule"],
      ]) {
        const r = run("why", YARD_TUG, "--rule", rule);
        expect(r.code).toBe(2);
        expect(r.out).toBe("");
        noStackTrace(r.err);
        expect(r.err.split("\n")[0]).toContain(message);
      }
    },
    SLOW,
  );
});
