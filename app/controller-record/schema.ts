// The controller settings record (chainproof/controller-record@1): its shape, the orders its numbers
// must keep, and validation that names every problem by its path. Pure: no React, no database, no Node.
import { z } from "zod";
import { LOCKOUTS, formatPath, type Lockout, type Problem } from "../engine/index";
import { deriveValues, uncomputable } from "./derive";
import { textProblem } from "../lib/text";

export const CONTROLLER_RECORD_FORMAT = "chainproof/controller-record@1";

export const CHEMISTRIES = ["lifepo4", "nmc", "lto", "lead-acid"] as const;
export type Chemistry = (typeof CHEMISTRIES)[number];

export const SENSORS = ["hall", "resistive-3wire", "voltage"] as const;
export type ThrottleSensor = (typeof SENSORS)[number];

/** The longest controller description kept. */
export const DESCRIPTION_MAX = 200;

const required = (what: string) => (issue: { input?: unknown }) => (issue.input === undefined ? "is required" : `must be ${what}`);

/** A finite number above 0 (the unit is the field's own). */
const positive = z.number({ error: required("a number") }).positive({ error: "must be above 0" });
const percent = z
  .number({ error: required("a number") })
  .min(0, { error: "must be from 0 to 100 %" })
  .max(100, { error: "must be from 0 to 100 %" });
const throttleV = z
  .number({ error: required("a number") })
  .min(0, { error: "must be from 0 to 5 V (the throttle input's range)" })
  .max(5, { error: "must be from 0 to 5 V (the throttle input's range)" });

const packSchema = z.looseObject({
  chemistry: z.enum(CHEMISTRIES, { error: required(`one of ${CHEMISTRIES.join(", ")}`) }),
  seriesCells: z
    .number({ error: required("a whole number") })
    .int({ error: "must be a whole number" })
    .min(1, { error: "must be at least 1" }),
  capacityAh: positive,
  continuousC: positive.optional(),
  fuseA: positive.optional(),
});

const controllerSchema = z.looseObject({
  description: z
    .string({ error: required("text") })
    .max(DESCRIPTION_MAX, { error: `must be at most ${DESCRIPTION_MAX} characters` })
    // The text rules of every field (decision 101); a NUL is named once, by the check of the whole record below.
    .refine((s) => s.includes("\u0000") || textProblem(s) === null, {
      error:
        "must not contain a broken character (U+FFFD, an unpaired surrogate) or a text-direction override (U+202A–U+202E, U+2066–U+2069)",
    }),
  ratedCurrentA: positive,
  minVoltageV: positive,
  maxVoltageV: positive,
});

const throttleSchema = z.looseObject({
  sensor: z.enum(SENSORS, { error: required(`one of ${SENSORS.join(", ")}`) }),
  restV: throttleV,
  fullV: throttleV,
  releasedBelowV: throttleV,
  appliedFromV: throttleV,
  faultBelowV: throttleV,
  faultAboveV: throttleV,
});

const prechargeSchema = z.looseObject({
  resistorOhm: positive,
  capacitanceUF: positive,
  delayMs: positive,
});

const settingsSchema = z.looseObject({
  lowVoltageCutbackV: positive,
  overVoltageCutoffV: positive,
  batteryCurrentPercent: percent,
  motorCurrentPercent: percent,
  throttle: throttleSchema,
  brakeCutsDrive: z.boolean({ error: "must be true or false" }).optional(),
  lockouts: z.array(z.enum(LOCKOUTS, { error: `must be one of ${LOCKOUTS.join(", ")}` }), { error: "must be a list" }).optional(),
  precharge: prechargeSchema.optional(),
});

/** The document's shape, every field with its own limits (the orders between fields: `orderProblems`). */
export const controllerRecordShape = z.looseObject({
  format: z.literal(CONTROLLER_RECORD_FORMAT, { error: `must be "${CONTROLLER_RECORD_FORMAT}"` }),
  pack: packSchema,
  controller: controllerSchema,
  settings: settingsSchema,
});

export type ControllerRecord = z.infer<typeof controllerRecordShape>;
export type PackSection = ControllerRecord["pack"];
export type ThrottleSettings = ControllerRecord["settings"]["throttle"];
export type PrechargeSettings = NonNullable<ControllerRecord["settings"]["precharge"]>;

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === "object" && v !== null && !Array.isArray(v);
const num = (v: unknown): number | undefined => (typeof v === "number" && Number.isFinite(v) ? v : undefined);

/**
 * The orders between fields, checked on the raw document wherever both values are numbers, so they are
 * reported together with every other problem. Each broken order is named at its first field.
 */
export function orderProblems(input: unknown): Problem[] {
  const out: Problem[] = [];
  if (!isObj(input)) return out;
  const pairs: [Obj | undefined, string, string, string, "<" | "<=", string][] = [];
  const settings = isObj(input.settings) ? input.settings : undefined;
  const throttle = settings && isObj(settings.throttle) ? settings.throttle : undefined;
  const controller = isObj(input.controller) ? input.controller : undefined;
  // The spec's orders of the throttle.
  pairs.push([throttle, "settings.throttle", "restV", "fullV", "<", "the reading at rest must be below the reading fully applied"]);
  pairs.push([
    throttle,
    "settings.throttle",
    "faultBelowV",
    "releasedBelowV",
    "<",
    "the low fault threshold must be below the released threshold",
  ]);
  pairs.push([
    throttle,
    "settings.throttle",
    "releasedBelowV",
    "appliedFromV",
    "<=",
    "the released threshold must not be above the applied threshold",
  ]);
  pairs.push([
    throttle,
    "settings.throttle",
    "appliedFromV",
    "faultAboveV",
    "<",
    "the applied threshold must be below the high fault threshold",
  ]);
  // Ours (decision 121): a range whose bottom is above its top cannot be set.
  pairs.push([
    controller,
    "controller",
    "minVoltageV",
    "maxVoltageV",
    "<",
    "the lowest voltage the controller accepts must be below the highest",
  ]);
  pairs.push([
    settings,
    "settings",
    "lowVoltageCutbackV",
    "overVoltageCutoffV",
    "<",
    "the low-voltage cut-back must be below the over-voltage cut-off",
  ]);
  for (const [obj, at, a, b, op, message] of pairs) {
    if (!obj) continue;
    const x = num(obj[a]);
    const y = num(obj[b]);
    if (x === undefined || y === undefined) continue;
    const ok = op === "<" ? x < y : x <= y;
    if (!ok) out.push({ path: `${at}.${a}`, message: `${message} (${x} ${op === "<" ? "is not below" : "is above"} ${y})` });
  }
  return out;
}

/** Every string (key or value) holding a NUL character: it cannot be stored (decision 121). */
function nulProblems(input: unknown, path: (string | number)[], out: Problem[]): void {
  if (typeof input === "string") {
    if (input.includes("\u0000")) out.push({ path: formatPath(path), message: "must not contain a NUL character" });
  } else if (Array.isArray(input)) {
    input.forEach((v, i) => nulProblems(v, [...path, i], out));
  } else if (isObj(input)) {
    for (const [k, v] of Object.entries(input)) {
      if (k.includes("\u0000")) out.push({ path: formatPath(path), message: "a key must not contain a NUL character" });
      else nulProblems(v, [...path, k], out);
    }
  }
}

/**
 * The whole record: its shape, the orders between fields, no NUL character anywhere, and derived values
 * that can be computed. Every problem comes with its path, all at once (the orders are checked even
 * when another field is broken). The API, the form and the command line validate with this one schema.
 */
export const controllerRecordSchema = controllerRecordShape.superRefine(
  (value, ctx) => {
    const raw: unknown = value;
    const more: Problem[] = [...orderProblems(raw)];
    nulProblems(raw, [], more);
    if (more.length === 0) {
      const shaped = controllerRecordShape.safeParse(raw);
      if (shaped.success) more.push(...uncomputable(deriveValues(shaped.data)));
    }
    for (const p of more) ctx.addIssue({ code: "custom", path: p.path === "" ? [] : pathOf(p.path), message: p.message });
  },
  { when: () => true },
);

/** "settings.lockouts[1]" -> ["settings", "lockouts", 1] */
function pathOf(path: string): (string | number)[] {
  return path.split(/\.|(?=\[)/).map((seg) => (seg.startsWith("[") ? Number(seg.slice(1, -1)) : seg));
}

export type RecordValidation = { ok: true; record: ControllerRecord } | { ok: false; problems: Problem[] };

/** The record checked whole; every problem with its path. */
export function validateRecord(input: unknown): RecordValidation {
  const parsed = controllerRecordSchema.safeParse(input);
  if (parsed.success) return { ok: true, record: parsed.data };
  return { ok: false, problems: dedupe(parsed.error.issues.map((i) => ({ path: formatPath(i.path), message: i.message }))) };
}

function dedupe(problems: Problem[]): Problem[] {
  const seen = new Set<string>();
  return problems.filter((p) => {
    const key = `${p.path}\u0000${p.message}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

/** The record's lockouts (none when absent) and brake behaviour (cuts drive when absent). */
export function recordLockouts(r: ControllerRecord): Lockout[] {
  return r.settings.lockouts ?? [];
}
export function recordBrakeCutsDrive(r: ControllerRecord): boolean {
  return r.settings.brakeCutsDrive ?? true;
}
