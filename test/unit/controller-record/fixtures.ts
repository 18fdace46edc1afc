// Records for the controller-record tests: the spec's example and small changes of it.
import type { Design } from "../../../app/engine";

export type Json = Record<string, any>;

/** The spec's example record (controller-record.md section 1): 16 LiFePO4 cells, a 400 A controller. */
export function exampleRecord(): Json {
  return {
    format: "chainproof/controller-record@1",
    pack: { chemistry: "lifepo4", seriesCells: 16, capacityAh: 100, continuousC: 1, fuseA: 250 },
    controller: { description: "48-72 V, 400 A sensorless", ratedCurrentA: 400, minVoltageV: 18, maxVoltageV: 90 },
    settings: {
      lowVoltageCutbackV: 42,
      overVoltageCutoffV: 62,
      batteryCurrentPercent: 50,
      motorCurrentPercent: 80,
      throttle: { sensor: "hall", restV: 0.85, fullV: 4.2, releasedBelowV: 1.0, appliedFromV: 1.1, faultBelowV: 0.5, faultAboveV: 4.5 },
      brakeCutsDrive: true,
      lockouts: ["power-on", "enable-restore", "direction-engage"],
      precharge: { resistorOhm: 47, capacitanceUF: 1000, delayMs: 250 },
    },
  };
}

/** A copy of `base` with the value at a dotted path replaced (undefined deletes the key). */
export function withValue(base: Json, path: string, value: unknown): Json {
  const copy = structuredClone(base);
  const keys = path.split(".");
  let at: Json = copy;
  for (const k of keys.slice(0, -1)) at = at[k];
  const last = keys[keys.length - 1];
  if (value === undefined) delete at[last];
  else at[last] = value;
  return copy;
}

/** Only the part of a design the record is checked against: its controller. */
export function designController(controller: Partial<Design["controller"]> & { fault?: string[] }): Pick<Design, "controller"> {
  const { fault, ...rest } = controller;
  return {
    controller: {
      throttle: { condition: "throttle", released: ["released"], applied: ["applied"], fault: fault ?? ["fault"] },
      ...rest,
    },
  };
}
