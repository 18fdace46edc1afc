// The caution shown wherever people act on what Chainproof computes.
export const SAFETY_TEXT =
  "Chainproof helps you reason about interlock logic; it does not certify a vehicle. Isolate the traction battery before working on the wiring, verify every result on the vehicle itself, and follow local codes, standards and licensed practice.";

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
