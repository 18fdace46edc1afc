// The record as a flat form (field name = the field's path, value = its text) and back, shared by the
// page (immediate feedback) and its action (the authority). Pure: no React.
import { z } from "zod";
import { LOCKOUTS, type Lockout } from "../engine/index";
import { CONTROLLER_RECORD_FORMAT, controllerRecordSchema, type ControllerRecord } from "./schema";

/** The numeric fields, in form order; `optional` ones may be left empty. */
export const NUMBER_FIELDS = [
  "pack.seriesCells",
  "pack.capacityAh",
  "pack.continuousC",
  "pack.fuseA",
  "controller.ratedCurrentA",
  "controller.minVoltageV",
  "controller.maxVoltageV",
  "settings.lowVoltageCutbackV",
  "settings.overVoltageCutoffV",
  "settings.batteryCurrentPercent",
  "settings.motorCurrentPercent",
  "settings.throttle.restV",
  "settings.throttle.fullV",
  "settings.throttle.releasedBelowV",
  "settings.throttle.appliedFromV",
  "settings.throttle.faultBelowV",
  "settings.throttle.faultAboveV",
  "settings.precharge.resistorOhm",
  "settings.precharge.capacitanceUF",
  "settings.precharge.delayMs",
] as const;

export const OPTIONAL_FIELDS = new Set<string>(["pack.continuousC", "pack.fuseA"]);
export const PRECHARGE_FIELDS = [
  "settings.precharge.resistorOhm",
  "settings.precharge.capacitanceUF",
  "settings.precharge.delayMs",
] as const;

/** The name of a lockout's checkbox. */
export const lockoutField = (l: Lockout) => `settings.lockouts.${l}`;

export type RecordForm = Record<string, string>;

/** A number as typed: a comma works as the decimal point; text that is no number stays text (and is refused). */
function number(text: string | undefined): number | string | undefined {
  const t = (text ?? "").trim();
  if (t === "") return undefined;
  const normal = t.includes(".") ? t : t.replace(",", ".");
  const n = Number(normal);
  return /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(normal) && Number.isFinite(n) ? n : t;
}

function put(doc: Record<string, unknown>, path: string, value: unknown): void {
  const keys = path.split(".");
  let at = doc;
  for (const k of keys.slice(0, -1)) {
    if (typeof at[k] !== "object" || at[k] === null || Array.isArray(at[k])) at[k] = {};
    at = at[k] as Record<string, unknown>;
  }
  const last = keys[keys.length - 1];
  if (value === undefined) delete at[last];
  else at[last] = value;
}

/**
 * The record document from the form's fields, laid over `base` (the version being changed), so keys the
 * form does not show (sent through the API) are kept. An empty optional field removes its key; the
 * precharge left wholly empty removes the precharge.
 */
export function formToRecord(form: RecordForm, base: unknown = undefined): Record<string, unknown> {
  const doc: Record<string, unknown> =
    typeof base === "object" && base !== null && !Array.isArray(base) ? structuredClone(base as Record<string, unknown>) : {};
  doc.format = CONTROLLER_RECORD_FORMAT;
  put(doc, "pack.chemistry", (form["pack.chemistry"] ?? "").trim() || undefined);
  put(doc, "controller.description", (form["controller.description"] ?? "").trim());
  put(doc, "settings.throttle.sensor", (form["settings.throttle.sensor"] ?? "").trim() || undefined);
  const brake = form["settings.brakeCutsDrive"];
  put(
    doc,
    "settings.brakeCutsDrive",
    brake === "yes" ? true : brake === "no" ? false : brake === undefined || brake === "" ? undefined : brake,
  );
  put(
    doc,
    "settings.lockouts",
    LOCKOUTS.filter((l) => form[lockoutField(l)] !== undefined && form[lockoutField(l)] !== ""),
  );
  const prechargeEmpty = PRECHARGE_FIELDS.every((f) => (form[f] ?? "").trim() === "");
  if (prechargeEmpty) put(doc, "settings.precharge", undefined);
  for (const f of NUMBER_FIELDS) {
    if (prechargeEmpty && (PRECHARGE_FIELDS as readonly string[]).includes(f)) continue;
    put(doc, f, number(form[f]));
  }
  return doc;
}

/** The form's fields showing a record (for the form's defaults). */
export function recordToForm(r: ControllerRecord | null): RecordForm {
  const out: RecordForm = {};
  if (!r) return out;
  const get = (path: string): unknown =>
    path.split(".").reduce<unknown>((at, k) => (at && typeof at === "object" ? (at as Record<string, unknown>)[k] : undefined), r);
  for (const f of NUMBER_FIELDS) {
    const v = get(f);
    if (typeof v === "number") out[f] = String(v);
  }
  out["pack.chemistry"] = r.pack.chemistry;
  out["controller.description"] = r.controller.description;
  out["settings.throttle.sensor"] = r.settings.throttle.sensor;
  out["settings.brakeCutsDrive"] = (r.settings.brakeCutsDrive ?? true) ? "yes" : "no";
  for (const l of r.settings.lockouts ?? []) out[lockoutField(l)] = "on";
  return out;
}

/**
 * The form's schema: its text fields become the record, which must pass the record's own schema; a
 * problem's path is the field's name. The page and the action share it.
 */
export const controllerFormSchema = z
  .record(z.string(), z.string())
  .transform((form) => formToRecord(form))
  .pipe(controllerRecordSchema);
