// Form primitives: labelled fields with their error, buttons, notices.
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

type Tone = "primary" | "secondary" | "danger" | "ghost";
const tones: Record<Tone, string> = {
  primary: "bg-copper-600 text-white hover:bg-copper-700 disabled:bg-ink-300",
  secondary: "bg-white text-ink-800 border border-ink-300 hover:bg-ink-100",
  danger: "bg-brick-600 text-white hover:bg-brick-700",
  ghost: "text-ink-700 hover:bg-ink-100",
};

export function buttonClass(tone: Tone = "primary", extra = "") {
  return `inline-flex min-h-10 items-center justify-center gap-2 rounded-md px-4 py-2 text-sm font-semibold shadow-sm transition-colors disabled:cursor-not-allowed ${tones[tone]} ${extra}`;
}

export function Button({ tone = "primary", className = "", ...rest }: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: Tone }) {
  return <button className={buttonClass(tone, className)} {...rest} />;
}

export function Notice({ tone = "info", children }: { tone?: "info" | "error" | "success" | "warning"; children: ReactNode }) {
  const styles = {
    info: "border-ink-200 bg-white text-ink-800",
    error: "border-brick-600 bg-brick-50 text-brick-700",
    success: "border-moss-600 bg-moss-50 text-moss-700",
    warning: "border-copper-500 bg-copper-50 text-copper-700",
  }[tone];
  return (
    <div role={tone === "error" ? "alert" : "status"} className={`rounded-md border-l-4 px-4 py-3 text-sm ${styles}`}>
      {children}
    </div>
  );
}
