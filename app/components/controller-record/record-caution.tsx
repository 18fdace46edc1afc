// What a controller settings record is and is not: the words every page with a record shows.
export const RECORD_CAUTION =
  "This record is what a technician entered, not what the controller holds. Verify each setting on the vehicle itself, and follow the controller maker's documentation and local practice.";

export function RecordCaution({ className = "" }: { className?: string }) {
  return (
    <p className={`rounded-md border border-ink-200 bg-ink-50 px-4 py-3 text-sm text-ink-700 ${className}`} data-testid="record-caution">
      {RECORD_CAUTION}
    </p>
  );
}
