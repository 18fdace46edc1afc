// The documents a new design can start from: a blank one or a copy of a demo design.
import { DESIGN_FORMAT } from "~/engine";
import haybarn from "../../drizzle/demo-designs/haybarn-campus-hauler.json";
import meadowline from "../../drizzle/demo-designs/meadowline-deck-mower.draft.json";
import scree from "../../drizzle/demo-designs/scree-trail-bike.draft.json";
import type { StartKey } from "./forms";

/**
 * The rule a blank design starts with (decision 112): "must drive when the throttle is applied",
 * valid (it matches rows) but failing until the engineer wires the supply to the enable input; its
 * label says which conditions of driving are left to add.
 */
export const STARTING_RULE = {
  id: "D1",
  label: "Must drive when the throttle is applied (complete it: add seat, key, direction…)",
  type: "require-drive",
  when: { all: [{ cond: "throttle", in: ["applied"] }] },
} as const;

/**
 * The smallest valid design that is plainly unfinished: a supply, an unwired enable input (so it
 * never drives yet), a throttle condition and one require-drive rule to complete.
 */
export function blankDocument(name: string): Record<string, unknown> {
  return {
    format: DESIGN_FORMAT,
    name,
    conditions: [{ id: "throttle", label: "Throttle", states: ["released", "applied"] }],
    components: [
      { id: "PACK", type: "supply", label: "Battery +" },
      { id: "EN", type: "input", label: "Controller enable", function: "enable" },
    ],
    wires: [],
    controller: { throttle: { condition: "throttle", released: ["released"], applied: ["applied"], fault: [] }, lockouts: [] },
    rules: [structuredClone(STARTING_RULE)],
    layout: { PACK: { x: 0, y: 0 }, EN: { x: 480, y: 0 } },
  };
}

const DEMOS: Record<Exclude<StartKey, "blank">, unknown> = { haybarn, meadowline, scree };

/** A fresh copy of the starting document, carrying the design's name. */
export function startingDocument(start: StartKey, name: string): Record<string, unknown> {
  if (start === "blank") return blankDocument(name);
  const copy = structuredClone(DEMOS[start]) as Record<string, unknown>;
  return { ...copy, name };
}
