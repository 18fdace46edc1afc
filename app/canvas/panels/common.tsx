// Small pieces shared by the side panels: compact labelled fields, field problems, the document.
import { useId, useMemo, type ButtonHTMLAttributes, type InputHTMLAttributes, type ReactNode } from "react";
import { validateDesign, type Problem } from "../../engine";
import { flowToDocument } from "../convert";
import { useEditor } from "../store";

export function useDocument() {
  const rest = useEditor((s) => s.rest);
  const nodes = useEditor((s) => s.nodes);
  const edges = useEditor((s) => s.edges);
  return useMemo(() => flowToDocument(rest, nodes, edges), [rest, nodes, edges]);
}

/** Immediate validation of the document being edited (the engine's own rules). */
export function useValidation(): Problem[] {
  const doc = useDocument();
  return useMemo(() => {
    const v = validateDesign(doc);
    return v.ok ? [] : v.problems;
  }, [doc]);
}

/** Problems at `path` or anywhere inside it. */
export function problemsUnder(problems: readonly Problem[], path: string): Problem[] {
  return problems.filter((p) => p.path === path || p.path.startsWith(`${path}.`) || p.path.startsWith(`${path}[`));
}

export function FieldProblems({ problems }: { problems: readonly Problem[] }) {
  if (problems.length === 0) return null;
  return (
    <ul className="mt-1 space-y-0.5 text-xs text-brick-700" role="alert">
      {problems.map((p) => (
        <li key={`${p.path}:${p.message}`}>
          <code className="font-mono text-[11px]">{p.path || "(document)"}</code> {p.message}
        </li>
      ))}
    </ul>
  );
}

const inputClass =
  "mt-0.5 block w-full rounded border border-ink-300 bg-white px-2 py-1 text-sm text-ink-900 focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-500/40 disabled:bg-ink-100 disabled:text-ink-500";

export function Text({ label, invalid, ...rest }: { label: string; invalid?: boolean } & InputHTMLAttributes<HTMLInputElement>) {
  const id = useId();
  return (
    <div>
      <label htmlFor={id} className="block text-xs font-medium text-ink-600">
        {label}
      </label>
      <input id={id} aria-invalid={invalid || undefined} className={`${inputClass} ${invalid ? "border-brick-600" : ""}`} {...rest} />
    </div>
  );
}

export function Select({ label, children, invalid, ...rest }: { label: string; invalid?: boolean; children: ReactNode } & React.SelectHTMLAttributes<HTMLSelectElement>) {
  const id = useId();
  return (
    <div>
      <label htmlFor={id} className="block text-xs font-medium text-ink-600">
        {label}
      </label>
      <select id={id} aria-invalid={invalid || undefined} className={`${inputClass} ${invalid ? "border-brick-600" : ""}`} {...rest}>
        {children}
      </select>
    </div>
  );
}

export function Small({ tone = "secondary", className = "", ...rest }: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: "primary" | "secondary" | "danger" | "ghost" }) {
  const tones = {
    primary: "bg-copper-600 text-white hover:bg-copper-700 disabled:bg-ink-300",
    secondary: "border border-ink-300 bg-white text-ink-800 hover:bg-ink-100 disabled:text-ink-400",
    danger: "border border-brick-600 bg-white text-brick-700 hover:bg-brick-50 disabled:text-ink-400",
    ghost: "text-ink-700 hover:bg-ink-100 disabled:text-ink-400",
  };
  return (
    <button
      type="button"
      className={`inline-flex items-center gap-1 rounded px-2 py-1 text-xs font-semibold disabled:cursor-not-allowed ${tones[tone]} ${className}`}
      {...rest}
    />
  );
}

export function Section({ title, children, actions }: { title: string; children: ReactNode; actions?: ReactNode }) {
  return (
    <section className="border-b border-ink-200 px-3 py-3">
      <div className="mb-2 flex items-center justify-between gap-2">
        <h3 className="text-xs font-bold uppercase tracking-wide text-ink-500">{title}</h3>
        {actions}
      </div>
      <div className="space-y-2">{children}</div>
    </section>
  );
}

/** Toggle chips for picking states (aria-pressed buttons, keyboard friendly). */
export function StateChips({
  states,
  picked,
  onToggle,
  disabled,
  label,
}: {
  states: readonly string[];
  picked: readonly string[];
  onToggle: (state: string) => void;
  disabled?: boolean;
  label: string;
}) {
  return (
    <div role="group" aria-label={label} className="flex flex-wrap gap-1">
      {states.map((st) => {
        const on = picked.includes(st);
        return (
          <button
            key={st}
            type="button"
            aria-pressed={on}
            disabled={disabled}
            onClick={() => onToggle(st)}
            className={`rounded-full border px-2 py-0.5 text-xs font-medium ${on ? "border-copper-600 bg-copper-600 text-white" : "border-ink-300 bg-white text-ink-700 hover:bg-ink-100"} disabled:cursor-not-allowed`}
          >
            {st}
          </button>
        );
      })}
      {states.length === 0 ? <span className="text-xs text-ink-500">(no states)</span> : null}
    </div>
  );
}

export const toggle = (list: readonly string[], item: string, order: readonly string[]) =>
  list.includes(item) ? list.filter((x) => x !== item) : order.filter((s) => s === item || list.includes(s));
