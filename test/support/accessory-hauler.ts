// A 98,304-row design for end-to-end tests: the demo hauler with nine more interlocked accessories
// (invented for the tests) in series on the enable line, two of them with their own rule.
import { readFileSync } from "node:fs";
import type { Design } from "../../app/engine";

const HAULER = JSON.parse(
  readFileSync(new URL("../../drizzle/demo-designs/haybarn-campus-hauler.json", import.meta.url), "utf8"),
) as Design;

const ACCESSORIES: Array<[id: string, label: string, safe: string, other: string]> = [
  ["bed", "Cargo bed", "down", "raised"],
  ["hitch", "Tow hitch pin", "stowed", "fitted"],
  ["hood", "Motor hood", "closed", "open"],
  ["cover", "Battery cover", "closed", "open"],
  ["ldoor", "Left door", "shut", "open"],
  ["rdoor", "Right door", "shut", "open"],
  ["tilt", "Tilt sensor", "level", "tilted"],
  ["belt", "Seat belt", "clipped", "loose"],
  ["service", "Service switch", "run", "service"],
];

export function accessoryHauler(): Design {
  const d = structuredClone(HAULER);
  d.name = "Haybarn hauler with accessories";
  d.conditions.push(...ACCESSORIES.map(([id, label, safe, other]) => ({ id, label, states: [safe, other] })));
  // PARK.2 -> EN.in becomes PARK.2 -> A1 -> A2 -> ... -> EN.in
  d.wires = d.wires.filter((w) => !(w.from === "PARK.2" && w.to === "EN.in"));
  let prev = "PARK.2";
  for (const [id, label, safe] of ACCESSORIES) {
    const cid = `${id.toUpperCase()}_SW`;
    d.components.push({ id: cid, type: "contact", label: `${label} switch`, condition: id, closedIn: [safe] });
    d.wires.push({ from: prev, to: `${cid}.1` });
    prev = `${cid}.2`;
  }
  d.wires.push({ from: prev, to: "EN.in" });
  d.rules.splice(
    d.rules.length - 1,
    0,
    {
      id: "bed-raised",
      label: "No drive with the cargo bed raised",
      type: "inhibit",
      when: { cond: "bed", in: ["raised"] },
      forbid: "drive",
    },
    { id: "service", label: "No drive in service mode", type: "inhibit", when: { cond: "service", in: ["service"] }, forbid: "drive" },
  );
  return d;
}
