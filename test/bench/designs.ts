// Generated designs for the benchmark: a large series-parallel drive-inhibit harness.
import type { Component, Design, Rule } from "../../app/engine/schema";

/**
 * `conditions` two-state conditions (c00, c01, ...) plus a three-state throttle, so 2^n * 3 rows.
 * A two-pole key feeds power; the enable line is a chain of stages (single contacts, parallel
 * branches of two contacts in series, redundant series pairs with a bypass) over the other
 * conditions; direction (redundant pairs) and brake (parallel) branches hang off power.
 */
export function generatedDesign(conditions = 21, stageLimit = Infinity): Design {
  const cond = (i: number) => `c${String(i).padStart(2, "0")}`;
  const components: Component[] = [{ id: "BAT", type: "supply", label: "Pack +" }];
  const wires: Design["wires"] = [];
  const contact = (id: string, c: number, closedIn: "on" | "off") => {
    components.push({ id, type: "contact", label: id, condition: cond(c), closedIn: [closedIn] });
  };
  const junction = (id: string) => components.push({ id, type: "junction" });
  const wire = (from: string, to: string) => wires.push({ from, to });

  // Power: a double-pole key switch, both poles in series.
  contact("KEY", 0, "on");
  contact("KEY2", 0, "on");
  junction("JP");
  wire("BAT.+", "KEY.1");
  wire("KEY.2", "KEY2.1");
  wire("KEY2.2", "JP.j");
  // Direction, brake: from the power junction.
  const dirF = conditions - 6;
  const dirR = conditions - 5;
  const brakeA = conditions - 4;
  const brakeB = conditions - 3;
  contact("DF", dirF, "on");
  contact("DF2", dirF, "on");
  contact("DR", dirR, "on");
  contact("DR2", dirR, "on");
  contact("DFI", dirR, "off"); // forward only when reverse is not selected
  contact("BKA", brakeA, "on");
  contact("BKB", brakeB, "on");
  wire("JP.j", "DF.1");
  wire("DF.2", "DF2.1");
  wire("DF2.2", "DFI.1");
  wire("JP.j", "DR.1");
  wire("DR.2", "DR2.1");
  wire("JP.j", "BKA.1");
  wire("JP.j", "BKB.1");
  wire("BKA.2", "BKB.2");
  // Enable chain over conditions 1 .. conditions-7, three kinds of stage in turn.
  let prev = "JP.j";
  let stage = 0;
  let n = 0;
  for (let c = 1; c <= conditions - 7 && stage < stageLimit; stage++) {
    const j = `JE${stage}`;
    junction(j);
    const kind = stage % 3;
    if (kind === 0 || c === conditions - 7) {
      // single contact
      contact(`S${n}`, c, "on");
      wire(prev, `S${n}.1`);
      wire(`S${n}.2`, `${j}.j`);
      n += 1;
      c += 1;
    } else if (kind === 1) {
      // two branches in parallel, each two contacts in series over two conditions
      const ja = `JA${stage}`;
      const jb = `JB${stage}`;
      junction(ja);
      junction(jb);
      contact(`P${n}`, c, "on");
      contact(`P${n + 1}`, c + 1, "off");
      contact(`P${n + 2}`, c + 1, "on");
      contact(`P${n + 3}`, c, "off");
      wire(prev, `P${n}.1`);
      wire(`P${n}.2`, `${ja}.j`);
      wire(`${ja}.j`, `P${n + 1}.1`);
      wire(`P${n + 1}.2`, `${j}.j`);
      wire(prev, `P${n + 2}.1`);
      wire(`P${n + 2}.2`, `${jb}.j`);
      wire(`${jb}.j`, `P${n + 3}.1`);
      wire(`P${n + 3}.2`, `${j}.j`);
      n += 4;
      c += 2;
    } else {
      // redundant pair in series on one condition, bridged to the next stage by a second path
      const mid = `JM${stage}`;
      junction(mid);
      contact(`R${n}`, c, "off");
      contact(`R${n + 1}`, c, "off");
      contact(`B${n}`, c + 1, "on");
      wire(prev, `R${n}.1`);
      wire(`R${n}.2`, `${mid}.j`);
      wire(`${mid}.j`, `R${n + 1}.1`);
      wire(`R${n + 1}.2`, `${j}.j`);
      wire(`${mid}.j`, `B${n}.1`);
      wire(`B${n}.2`, `${j}.j`);
      n += 3;
      c += 2;
    }
    prev = `${j}.j`;
  }
  const inputs: Component[] = [
    { id: "PWR", type: "input", label: "Power", function: "power" },
    { id: "EN", type: "input", label: "Enable", function: "enable" },
    { id: "FWD", type: "input", label: "Forward", function: "forward" },
    { id: "REV", type: "input", label: "Reverse", function: "reverse" },
    { id: "BRK", type: "input", label: "Brake", function: "brake" },
  ];
  components.push(...inputs);
  wire("JP.j", "PWR.in");
  wire(prev, "EN.in");
  wire("DFI.2", "FWD.in");
  wire("DR2.2", "REV.in");
  wire("BKA.2", "BRK.in");
  const rules: Rule[] = [
    { id: "first-stage", type: "inhibit", when: { cond: cond(1), in: ["off"] }, forbid: "drive" },
    { id: "redundant", type: "inhibit", when: { cond: cond(3), in: ["on"] }, forbid: { energized: "EN" } },
    {
      id: "brake",
      type: "inhibit",
      when: {
        any: [
          { cond: cond(brakeA), in: ["on"] },
          { cond: cond(brakeB), in: ["on"] },
        ],
      },
      forbid: "drive",
    },
    {
      id: "neutral",
      type: "inhibit",
      when: {
        all: [
          { cond: cond(dirF), in: ["off"] },
          { cond: cond(dirR), in: ["off"] },
        ],
      },
      forbid: "drive",
    },
    { id: "parallel-member", type: "inhibit", when: { cond: cond(2), in: ["off"] }, forbid: "drive" },
    { id: "key-off", type: "inhibit", when: { cond: cond(0), in: ["off"] }, forbid: { energized: "EN" } },
    {
      id: "drives",
      type: "require-drive",
      when: {
        all: [
          { cond: cond(0), in: ["on"] },
          { cond: cond(dirF), in: ["on"] },
          { cond: cond(dirR), in: ["off"] },
          { cond: cond(brakeA), in: ["off"] },
          { cond: cond(brakeB), in: ["off"] },
          { cond: "throttle", in: ["applied"] },
        ],
      },
    },
    { id: "no-surprise", type: "no-restart" },
  ];
  return {
    format: "chainproof/design@1",
    name: `Generated harness, ${conditions} conditions`,
    conditions: [
      ...Array.from({ length: conditions }, (_, i) => ({ id: cond(i), label: cond(i), states: ["off", "on"] })),
      { id: "throttle", label: "Throttle", states: ["released", "applied", "fault"] },
    ],
    components,
    wires,
    controller: {
      throttle: { condition: "throttle", released: ["released"], applied: ["applied"], fault: ["fault"] },
      brakeCutsDrive: true,
      lockouts: ["power-on", "enable-restore", "direction-engage", "brake-release", "throttle-fault"],
    },
    rules,
  };
}
