// A small design for the printed-report tests: two contacts, each feeding one controller input, placed
// in three columns as the canvas would. The page-budget test widens its table with load conditions.
export function fiveParts() {
  return {
    format: "chainproof/design@1",
    name: "Five parts",
    conditions: [
      { id: "key", label: "Key", states: ["off", "on"] },
      { id: "seat", label: "Seat", states: ["empty", "occupied"] },
      { id: "grip", label: "Twist grip", states: ["closed", "open"] },
    ],
    components: [
      { id: "PACK", type: "supply", label: "Pack + (48 V)" },
      { id: "KEY", type: "contact", label: "Key switch", condition: "key", closedIn: ["on"] },
      { id: "SEAT", type: "contact", label: "Seat switch", condition: "seat", closedIn: ["occupied"] },
      { id: "PWR", type: "input", label: "Controller power", function: "power" },
      { id: "EN", type: "input", label: "Drive enable", function: "enable" },
    ],
    wires: [
      { from: "PACK.+", to: "KEY.1" },
      { from: "KEY.2", to: "PWR.in" },
      { from: "PACK.+", to: "SEAT.1" },
      { from: "SEAT.2", to: "EN.in" },
    ],
    controller: { throttle: { condition: "grip", released: ["closed"], applied: ["open"] }, brakeCutsDrive: false, lockouts: [] },
    rules: [{ id: "seat", label: "No drive with the seat empty", type: "inhibit", when: { cond: "seat", in: ["empty"] }, forbid: "drive" }],
    layout: {
      PACK: { x: 0, y: 100 },
      KEY: { x: 220, y: 30 },
      SEAT: { x: 220, y: 170 },
      PWR: { x: 460, y: 42 },
      EN: { x: 460, y: 182 },
    },
  };
}
