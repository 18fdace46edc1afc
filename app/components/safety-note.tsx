// The caution shown wherever people act on what Chainproof computes.
import { SAFETY_TEXT } from "~/lib/safety";

export { SAFETY_TEXT };

export function SafetyNote({ className = "" }: { className?: string }) {
  return (
    <aside
      aria-label="Safety caution"
      className={`flex gap-3 rounded-md border border-copper-500/40 bg-copper-50 px-4 py-3 text-sm text-copper-700 ${className}`}
    >
      <svg viewBox="0 0 20 20" className="mt-0.5 h-5 w-5 flex-none" aria-hidden="true">
        <path d="M10 2l8.5 15h-17z" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinejoin="round" />
        <path d="M10 8v4.5M10 14.6v.4" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
      </svg>
      <p>
        <strong className="font-semibold">Caution.</strong> {SAFETY_TEXT}
      </p>
    </aside>
  );
}
