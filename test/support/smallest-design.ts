// A design for the integration tests that need a revision to pass format 1.1 and nothing more.
import type { Json } from "./hauler";

/**
 * The smallest design that passes format 1.1 and has no single fault to dispose of (so a reviewer can
 * approve it at once): the enable input fed from the supply, must drive with the throttle applied.
 */
export const smallest = (name = "Small"): Json => ({
  format: "chainproof/design@1",
  name,
  conditions: [{ id: "throttle", label: "Throttle", states: ["released", "applied"] }],
  components: [
    { id: "PACK", type: "supply", label: "Battery +" },
    { id: "EN", type: "input", label: "Controller enable", function: "enable" },
  ],
  wires: [{ from: "PACK.+", to: "EN.in" }],
  controller: { throttle: { condition: "throttle", released: ["released"], applied: ["applied"], fault: [] }, lockouts: [] },
  rules: [{ id: "D1", label: "Drives with the throttle applied", type: "require-drive", when: { cond: "throttle", in: ["applied"] } }],
  layout: {},
});
