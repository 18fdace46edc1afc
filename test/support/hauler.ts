// The demo's campus hauler design, read fresh for each use (tests change it), and a require-drive
// rule that holds on it: the fixture the save-gate and format-1.1 revision tests build on.
import { readFileSync } from "node:fs";

export type Json = Record<string, any>;

export const hauler = (): Json =>
  JSON.parse(readFileSync(new URL("../../drizzle/demo-designs/haybarn-campus-hauler.json", import.meta.url), "utf8"));

/** Drives when keyed, seated, unplugged, park brake released, in gear, foot brake up and pedal down. */
export const HAULER_DRIVES = {
  id: "drives",
  label: "Drives when seated, keyed, unplugged, in gear, pedal down",
  type: "require-drive",
  when: {
    all: [
      { cond: "key", in: ["on"] },
      { cond: "seat", in: ["occupied"] },
      { cond: "plug", in: ["free"] },
      { cond: "park", in: ["released"] },
      { cond: "lever", in: ["forward", "reverse"] },
      { cond: "brake", in: ["up"] },
      { cond: "pedal", in: ["down"] },
    ],
  },
};
