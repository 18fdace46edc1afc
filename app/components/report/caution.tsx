// The caution the report prints on its cover and at its end.
import { SAFETY_TEXT } from "~/components/safety-note";

export function ReportCaution({ className }: { className: string }) {
  return (
    <aside className={`${className} border-l-4 border-copper-500 bg-copper-50 px-3 py-2 text-copper-700`} aria-label="Safety caution">
      <strong>Caution.</strong> {SAFETY_TEXT}
    </aside>
  );
}
