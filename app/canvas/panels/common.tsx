// Small pieces shared by the side panels: compact labelled fields (text fields that commit on
// Enter or when left), field problems, the document.
import {
  useEffect,
  useId,
  useLayoutEffect,
  useMemo,
  useRef,
  useState,
  type ButtonHTMLAttributes,
  type InputHTMLAttributes,
  type KeyboardEvent,
  type ReactNode,
} from "react";
import type { Problem } from "../../engine";
import { flowToDocument } from "../convert";
import { useEditor } from "../store";
import { Button, Chip } from "../../components/ui/button";

export function useDocument() {
  const rest = useEditor((s) => s.rest);
  const nodes = useEditor((s) => s.nodes);
  const edges = useEditor((s) => s.edges);
  return useMemo(() => flowToDocument(rest, nodes, edges), [rest, nodes, edges]);
}

/** The engine's problems with the document, from the latest check in the proof worker. */
export function useValidation(): Problem[] {
  return useEditor((s) => s.problems);
}

/** Problems at `path` or anywhere inside it. */
export function problemsUnder(problems: readonly Problem[], path: string): Problem[] {
  return problems.filter((p) => p.path === path || p.path.startsWith(`${path}.`) || p.path.startsWith(`${path}[`));
}

export function FieldProblems({ problems }: { problems: readonly Problem[] }) {
  if (problems.length === 0) return null;
  return (
    <ul className="mt-1 space-y-0.5 text-xs text-brick-700 [overflow-wrap:anywhere]" role="alert">
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

/**
 * A text field that changes the design only when it is committed (Enter, or leaving the field),
 * as one undo step. `onCommit` gives null when the value was taken, or the reason it was refused;
 * a refusal stays at the field with the typed text until it is fixed or Escape restores the value.
 */
export function CommitText({
  label,
  value,
  onCommit,
  disabled,
  invalid,
  hideLabel,
  className = "",
  ...rest
}: {
  label: string;
  value: string;
  onCommit: (typed: string) => string | null;
  disabled?: boolean;
  invalid?: boolean;
  hideLabel?: boolean;
  className?: string;
} & Omit<InputHTMLAttributes<HTMLInputElement>, "value" | "onChange" | "onBlur" | "onKeyDown" | "className">) {
  const id = useId();
  const [draft, setDraft] = useState(value);
  const [error, setError] = useState<string | null>(null);
  const focused = useRef(false);
  const committed = useRef(false);
  // The value changed under the field (undo, another field's rename, or this commit as the design
  // took it): show it, unless it is being typed in.
  useEffect(() => {
    if (!focused.current || committed.current) {
      committed.current = false;
      setDraft(value);
      setError(null);
    }
  }, [value]);
  const latest = useRef({ draft, value, onCommit, disabled });
  useLayoutEffect(() => {
    latest.current = { draft, value, onCommit, disabled };
  });
  // Leaving by unmounting (the selection moved on) still commits what was typed.
  useEffect(
    () => () => {
      const l = latest.current;
      if (!l.disabled && focused.current && l.draft !== l.value) l.onCommit(l.draft);
    },
    [],
  );
  const commit = () => {
    if (draft === value) return setError(null);
    const why = onCommit(draft);
    committed.current = why === null;
    setError(why);
  };
  const onKeyDown = (e: KeyboardEvent<HTMLInputElement>) => {
    if (e.key === "Enter") {
      e.preventDefault();
      commit();
    } else if (e.key === "Escape") {
      setDraft(value);
      setError(null);
    }
  };
  return (
    <div className={className}>
      <label htmlFor={id} className={hideLabel ? "sr-only" : "block text-xs font-medium text-ink-600"}>
        {label}
      </label>
      <input
        id={id}
        value={draft}
        disabled={disabled}
        aria-invalid={invalid || error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        className={`${inputClass} ${invalid || error ? "border-brick-600" : ""} ${hideLabel ? "mt-0" : ""}`}
        onFocus={() => (focused.current = true)}
        onChange={(e) => setDraft(e.target.value)}
        onBlur={() => {
          focused.current = false;
          commit();
        }}
        onKeyDown={onKeyDown}
        {...rest}
      />
      {error ? (
        <p id={`${id}-error`} role="alert" className="mt-1 text-xs text-brick-700 [overflow-wrap:anywhere]">
          Not changed: {error}. {draft !== value ? `Escape puts back “${value}”.` : ""}
        </p>
      ) : null}
    </div>
  );
}

export function Select({
  label,
  children,
  invalid,
  ...rest
}: { label: string; invalid?: boolean; children: ReactNode } & React.SelectHTMLAttributes<HTMLSelectElement>) {
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

export function Small({
  tone = "secondary",
  className = "",
  ...rest
}: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: "primary" | "secondary" | "danger" | "ghost" }) {
  const variant = ({ primary: "action", secondary: "secondary", danger: "danger-quiet", ghost: "ghost" } as const)[tone];
  return <Button type="button" variant={variant} size="compact" className={className} {...rest} />;
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
          <Chip key={st} pressed={on} disabled={disabled} onClick={() => onToggle(st)}>
            {st}
          </Chip>
        );
      })}
      {states.length === 0 ? <span className="text-xs text-ink-500">(no states)</span> : null}
    </div>
  );
}

export const toggle = (list: readonly string[], item: string, order: readonly string[]) =>
  list.includes(item) ? list.filter((x) => x !== item) : order.filter((s) => s === item || list.includes(s));
