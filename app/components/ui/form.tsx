// Form primitives: labelled fields with their error, buttons, notices.
import { buttonVariants } from "./button";
import type { InputHTMLAttributes, ReactNode, SelectHTMLAttributes, ButtonHTMLAttributes, TextareaHTMLAttributes } from "react";

const fieldBase =
  "mt-1 block w-full rounded-md border bg-white px-3 py-2 text-base sm:text-sm text-ink-900 shadow-sm placeholder:text-ink-400 focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-500/40";

type FieldProps = { label: string; name: string; error?: string; hint?: string };

/** The label, hint and error around one control, and the attributes that tie the control to them. */
function fieldParts({ label, name, error, hint }: FieldProps, explicitId: string | undefined) {
  const id = explicitId ?? `f-${name}`;
  const control = {
    id,
    name,
    "aria-invalid": error ? true : undefined,
    "aria-describedby": error ? `${id}-error` : hint ? `${id}-hint` : undefined,
    className: `${fieldBase} ${error ? "border-brick-600" : "border-ink-300"}`,
  };
  const frame = (child: ReactNode) => (
    <div>
      <label htmlFor={id} className="block text-sm font-medium text-ink-700">
        {label}
      </label>
      {child}
      {hint && !error ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-500">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} className="mt-1 text-sm text-brick-700" role="alert">
          {error}
        </p>
      ) : null}
    </div>
  );
  return { control, frame };
}

export function TextField({ label, name, error, hint, ...rest }: FieldProps & InputHTMLAttributes<HTMLInputElement>) {
  const { control, frame } = fieldParts({ label, name, error, hint }, rest.id);
  return frame(<input {...control} {...rest} />);
}

export function TextArea({ label, name, error, hint, ...rest }: FieldProps & TextareaHTMLAttributes<HTMLTextAreaElement>) {
  const { control, frame } = fieldParts({ label, name, error, hint }, rest.id);
  return frame(<textarea {...control} {...rest} />);
}

export function SelectField({
  label,
  name,
  error,
  hint,
  children,
  ...rest
}: FieldProps & SelectHTMLAttributes<HTMLSelectElement> & { children: ReactNode }) {
  const { control, frame } = fieldParts({ label, name, error, hint }, rest.id);
  return frame(
    <select {...control} {...rest}>
      {children}
    </select>,
  );
}

// The older tone names, kept for the forms that use them; new code uses <Button variant> from ./button.
type Tone = "primary" | "secondary" | "danger" | "ghost";
const VARIANT = { primary: "action", secondary: "secondary", danger: "danger", ghost: "ghost" } as const;

export function buttonClass(tone: Tone = "primary", extra = "") {
  return buttonVariants({ variant: VARIANT[tone], className: extra });
}

export function Button({ tone = "primary", className = "", ...rest }: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: Tone }) {
  return <button className={buttonClass(tone, className)} {...rest} />;
}

export function Notice({ tone = "info", children }: { tone?: "info" | "error" | "success" | "warning"; children: ReactNode }) {
  const styles = {
    info: "border-line bg-surface text-ink-800",
    error: "border-failing bg-failing-soft text-failing-ink",
    success: "border-proven bg-proven-soft text-proven-ink",
    warning: "border-caution bg-caution-soft text-caution-ink",
  }[tone];
  return (
    <div role={tone === "error" ? "alert" : "status"} className={`rounded-md border-l-4 px-4 py-3 text-sm ${styles}`}>
      {children}
    </div>
  );
}
