// The controller settings form, made for a phone: one column, a unit beside every number, the error at
// its field. A plain POST form (works without JavaScript); with it, the same zod schema as the server
// checks every field before sending.
import { Form } from "react-router";
import type { ReactNode } from "react";
import {
  CHEMISTRIES,
  CHEMISTRY_WORDS,
  FIELD_WORDS,
  LOCKOUT_WORDS,
  SENSORS,
  SENSOR_WORDS,
  controllerFormSchema,
  lockoutField,
  type RecordField,
  type RecordForm,
} from "~/controller-record";
import { LOCKOUTS } from "~/engine";
import { lockoutTitle } from "~/lib/lockouts";
import type { FieldErrors } from "~/lib/forms";
import { useFormCheck } from "~/lib/use-form-check";
import { Button } from "~/components/ui/form";
import { cardVariants } from "~/components/ui/card";

const inputBase =
  "block w-full min-w-0 rounded-l-md border bg-white px-3 py-2 text-base text-ink-900 shadow-sm focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-500/40";

/** A problem as a sentence under its field ("is required" -> "Is required."). */
const sentence = (text: string) => `${text.charAt(0).toUpperCase()}${text.slice(1)}${/[.!?]$/.test(text) ? "" : "."}`;

const idOf = (name: string) => `cr-${name.replace(/[^A-Za-z0-9-]/g, "-")}`;

function Frame({ name, error, children, hint }: { name: RecordField; error?: string; children: ReactNode; hint?: string }) {
  const words = FIELD_WORDS[name] as { label: string; unit?: string; hint?: string };
  const id = idOf(name);
  const help = hint ?? words.hint;
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-medium text-ink-700">
        {words.label}
        {words.unit ? <span className="sr-only"> ({words.unit})</span> : null}
      </label>
      {children}
      {help && !error ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-500">
          {help}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} className="mt-1 text-sm text-brick-700" role="alert">
          {sentence(error)}
        </p>
      ) : null}
    </div>
  );
}

function describedBy(name: string, error?: string, hint?: string) {
  const id = idOf(name);
  return error ? `${id}-error` : hint ? `${id}-hint` : undefined;
}

/** A number with its unit beside it. */
function NumberField({
  name,
  values,
  errors,
  optional = false,
}: {
  name: RecordField;
  values: RecordForm;
  errors: FieldErrors;
  optional?: boolean;
}) {
  const words = FIELD_WORDS[name] as { label: string; unit?: string; hint?: string };
  const error = errors[name];
  return (
    <Frame name={name} error={error}>
      <div className="mt-1 flex">
        <input
          id={idOf(name)}
          name={name}
          type="text"
          inputMode="decimal"
          autoComplete="off"
          defaultValue={values[name] ?? ""}
          required={!optional}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy(name, error, words.hint)}
          className={`${inputBase} ${error ? "border-brick-600" : "border-ink-300"}`}
        />
        <span
          className="inline-flex min-w-14 items-center justify-center rounded-r-md border border-l-0 border-ink-300 bg-ink-100 px-2 text-sm text-ink-700"
          aria-hidden="true"
        >
          {words.unit}
        </span>
      </div>
    </Frame>
  );
}

function Choice({
  name,
  values,
  errors,
  options,
}: {
  name: RecordField;
  values: RecordForm;
  errors: FieldErrors;
  options: [string, string][];
}) {
  const error = errors[name];
  return (
    <Frame name={name} error={error}>
      <select
        id={idOf(name)}
        name={name}
        defaultValue={values[name] ?? ""}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(name, error)}
        className={`mt-1 block w-full rounded-md border bg-white px-3 py-2 text-base text-ink-900 shadow-sm ${error ? "border-brick-600" : "border-ink-300"}`}
      >
        <option value="" disabled>
          Choose…
        </option>
        {options.map(([value, label]) => (
          <option key={value} value={value}>
            {label}
          </option>
        ))}
      </select>
    </Frame>
  );
}

function Group({ title, children, note }: { title: string; children: ReactNode; note?: string }) {
  return (
    <fieldset className={cardVariants({ padding: "md", className: "space-y-4" })}>
      <legend className="px-1 text-base font-semibold">{title}</legend>
      {note ? <p className="text-xs text-ink-600">{note}</p> : null}
      {children}
    </fieldset>
  );
}

export function RecordFormFields({
  values,
  baseVersion,
  serverErrors,
  busy,
}: {
  values: RecordForm;
  baseVersion: number;
  serverErrors?: FieldErrors;
  busy: boolean;
}) {
  const { errors, onSubmit } = useFormCheck(controllerFormSchema, serverErrors);
  const n = (name: RecordField, optional = false) => <NumberField name={name} values={values} errors={errors} optional={optional} />;
  const brakeError = errors["settings.brakeCutsDrive"];
  const lockoutError = errors["settings.lockouts"];
  const count = Object.keys(errors).length;
  return (
    <Form method="post" className="space-y-5" onSubmit={onSubmit} noValidate aria-label="Controller settings">
      <input type="hidden" name="baseVersion" value={baseVersion} />
      {count > 0 ? (
        <p role="alert" className="rounded-md border-l-4 border-brick-600 bg-brick-50 px-4 py-3 text-sm text-brick-700">
          {count === 1 ? "One field needs" : `${count} fields need`} a change before this can be saved; each says what below.
        </p>
      ) : null}
      <Group title="Traction pack">
        <Choice name="pack.chemistry" values={values} errors={errors} options={CHEMISTRIES.map((c) => [c, CHEMISTRY_WORDS[c]])} />
        {n("pack.seriesCells")}
        {n("pack.capacityAh")}
        {n("pack.continuousC", true)}
        {n("pack.fuseA", true)}
      </Group>
      <Group title="Motor controller">
        <Frame name="controller.description" error={errors["controller.description"]}>
          <input
            id={idOf("controller.description")}
            name="controller.description"
            type="text"
            maxLength={200}
            defaultValue={values["controller.description"] ?? ""}
            aria-invalid={errors["controller.description"] ? true : undefined}
            aria-describedby={describedBy(
              "controller.description",
              errors["controller.description"],
              FIELD_WORDS["controller.description"].hint,
            )}
            className={`mt-1 block w-full rounded-md border bg-white px-3 py-2 text-base shadow-sm ${errors["controller.description"] ? "border-brick-600" : "border-ink-300"}`}
          />
        </Frame>
        {n("controller.ratedCurrentA")}
        {n("controller.minVoltageV")}
        {n("controller.maxVoltageV")}
      </Group>
      <Group title="Voltage and current limits">
        {n("settings.lowVoltageCutbackV")}
        {n("settings.overVoltageCutoffV")}
        {n("settings.batteryCurrentPercent")}
        {n("settings.motorCurrentPercent")}
      </Group>
      <Group title="Throttle" note="Every voltage as measured at the controller's throttle input (0 to 5 V).">
        <Choice name="settings.throttle.sensor" values={values} errors={errors} options={SENSORS.map((s) => [s, SENSOR_WORDS[s]])} />
        {n("settings.throttle.restV")}
        {n("settings.throttle.fullV")}
        {n("settings.throttle.releasedBelowV")}
        {n("settings.throttle.appliedFromV")}
        {n("settings.throttle.faultBelowV")}
        {n("settings.throttle.faultAboveV")}
      </Group>
      <Group title="Brake and lockouts">
        <div role="radiogroup" aria-labelledby="cr-brake-label" aria-describedby={brakeError ? "cr-brake-error" : undefined}>
          <p id="cr-brake-label" className="text-sm font-medium text-ink-700">
            {FIELD_WORDS["settings.brakeCutsDrive"].label}
          </p>
          <div className="mt-2 flex flex-wrap gap-3">
            {[
              ["yes", "Yes, braking cuts drive"],
              ["no", "No, drive stays on while braking"],
            ].map(([value, label]) => (
              <label key={value} className="flex min-h-11 items-center gap-2 rounded-md border border-ink-300 px-3 text-sm">
                <input
                  type="radio"
                  name="settings.brakeCutsDrive"
                  value={value}
                  defaultChecked={(values["settings.brakeCutsDrive"] ?? "yes") === value}
                  className="h-5 w-5"
                />
                {label}
              </label>
            ))}
          </div>
          {brakeError ? (
            <p id="cr-brake-error" className="mt-1 text-sm text-brick-700" role="alert">
              {sentence(brakeError)}
            </p>
          ) : null}
        </div>
        <div role="group" aria-labelledby="cr-lockouts-label">
          <p id="cr-lockouts-label" className="text-sm font-medium text-ink-700">
            {FIELD_WORDS["settings.lockouts"].label}
          </p>
          <p className="text-xs text-ink-500">{FIELD_WORDS["settings.lockouts"].hint}. Tick each one the controller has switched on.</p>
          <ul className="mt-2 space-y-2">
            {LOCKOUTS.map((l) => (
              <li key={l}>
                <label className="flex min-h-11 items-start gap-3 rounded-md border border-ink-300 px-3 py-2 text-sm">
                  <input
                    type="checkbox"
                    name={lockoutField(l)}
                    value="on"
                    defaultChecked={values[lockoutField(l)] === "on"}
                    className="mt-0.5 h-5 w-5 flex-none"
                  />
                  <span>
                    <span className="font-medium">{lockoutTitle(l)}</span>: {LOCKOUT_WORDS[l]}
                  </span>
                </label>
              </li>
            ))}
          </ul>
          {lockoutError ? (
            <p className="mt-1 text-sm text-brick-700" role="alert">
              {sentence(lockoutError)}
            </p>
          ) : null}
        </div>
      </Group>
      <Group title="Precharge" note="Leave all three empty if the vehicle has no precharge circuit.">
        {n("settings.precharge.resistorOhm", true)}
        {n("settings.precharge.capacitanceUF", true)}
        {n("settings.precharge.delayMs", true)}
      </Group>
      {errors.form ? (
        <p role="alert" className="text-sm text-brick-700">
          {errors.form}
        </p>
      ) : null}
      <Button type="submit" disabled={busy} className="min-h-12 w-full text-base sm:w-auto">
        {busy ? "Saving…" : baseVersion === 0 ? "Save the first version" : `Save as version ${baseVersion + 1}`}
      </Button>
    </Form>
  );
}
