// The documents a new design can start from: a blank one or a copy of a demo design.
import { DESIGN_FORMAT } from "~/engine";
import haybarn from "../../drizzle/demo-designs/haybarn-campus-hauler.json";
import meadowline from "../../drizzle/demo-designs/meadowline-deck-mower.draft.json";
import scree from "../../drizzle/demo-designs/scree-trail-bike.draft.json";
import type { StartKey } from "./forms";

/** The smallest valid design: one supply and a throttle condition; no wiring and no rules yet. */
export function blankDocument(name: string): Record<string, unknown> {
  return {
    format: DESIGN_FORMAT,
    name,
    conditions: [{ id: "throttle", label: "Throttle", states: ["released", "applied"] }],
    components: [{ id: "PACK", type: "supply", label: "Battery +" }],
    wires: [],
    controller: { throttle: { condition: "throttle", released: ["released"], applied: ["applied"], fault: [] }, lockouts: [] },
    rules: [],
    layout: { PACK: { x: 0, y: 0 } },
  };
}

const DEMOS: Record<Exclude<StartKey, "blank">, unknown> = { haybarn, meadowline, scree };

/** A fresh copy of the starting document, carrying the design's name. */
export function startingDocument(start: StartKey, name: string): Record<string, unknown> {
  if (start === "blank") return blankDocument(name);
  const copy = structuredClone(DEMOS[start]) as Record<string, unknown>;
  return { ...copy, name };
}
