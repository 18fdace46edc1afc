// Generated designs for measuring the canvas: a chain of N contacts between one supply and the
// enable input (N conditions, 2^N+1 rows), laid out in a grid.
import type { Design } from "../../engine";

export function chainDesign(contacts: number, conditionsUsed = contacts): Design {
  const conditions = Array.from({ length: conditionsUsed }, (_, i) => ({ id: `c${i}`, label: `Guard ${i}`, states: ["open", "closed"] }));
  const components: Design["components"] = [{ id: "BAT", type: "supply", label: "Pack +" }];
  const wires: Design["wires"] = [];
  const layout: Record<string, { x: number; y: number }> = { BAT: { x: 0, y: 0 } };
  for (let i = 0; i < contacts; i++) {
    const id = `K${i}`;
    components.push({ id, type: "contact", label: `Guard switch ${i}`, condition: `c${i % conditionsUsed}`, closedIn: ["closed"] });
    wires.push({ from: i === 0 ? "BAT.+" : `K${i - 1}.2`, to: `${id}.1` });
    layout[id] = { x: 220 + (i % 10) * 220, y: Math.floor(i / 10) * 160 };
  }
  components.push({ id: "EN", type: "input", label: "Drive enable", function: "enable" });
  wires.push({ from: `K${contacts - 1}.2`, to: "EN.in" });
  layout.EN = { x: 220 + 10 * 220, y: 0 };
  conditions.push({ id: "throttle", label: "Throttle", states: ["released", "applied"] });
  return {
    format: "chainproof/design@1",
    name: `Chain of ${contacts} contacts`,
    conditions,
    components,
    wires,
    controller: { throttle: { condition: "throttle", released: ["released"], applied: ["applied"], fault: [] }, lockouts: ["power-on"] },
    rules: [
      { id: "guard0", label: "No drive with guard 0 open", type: "inhibit", when: { cond: "c0", in: ["open"] }, forbid: "drive" },
      { id: "restart", label: "No start on a held throttle", type: "no-restart" },
    ],
    layout,
  };
}
