// Small pieces of the design pages: status badge, the "not proven" marker, dates and hashes.
import type { ReactNode } from "react";
import { describeDraftCheck, STATUS_LABELS, type DesignStatus, type DraftCheck } from "./types";

export function StatusBadge({ status }: { status: DesignStatus }) {
  const tone = status === "proven" ? "border-moss-600/40 bg-moss-50 text-moss-700" : "border-ink-300 bg-ink-100 text-ink-700";
  return <span className={`inline-flex items-center rounded-full border px-2 py-0.5 text-xs font-semibold ${tone}`}>{STATUS_LABELS[status]}</span>;
}

/** The marker every unsaved working copy carries: it has not been proven by a save. */
export function NotProven({ check }: { check?: DraftCheck }) {
  const failing = check?.state === "invalid" || (check?.state === "checked" && !check.ok);
  return (
    <span className="inline-flex flex-wrap items-center gap-1.5 text-sm">
      <span className="inline-flex items-center gap-1 rounded-full border border-dashed border-copper-500 bg-copper-50 px-2 py-0.5 text-xs font-semibold text-copper-700">
        <svg viewBox="0 0 12 12" className="h-3 w-3" aria-hidden="true">
          <circle cx="6" cy="6" r="4.5" fill="none" stroke="currentColor" strokeWidth="1.5" strokeDasharray="2 1.6" />
        </svg>
        Draft, not proven
      </span>
      {check ? <span className={failing ? "text-brick-700" : "text-ink-600"}>{describeDraftCheck(check)}</span> : null}
    </span>
  );
}

export function Holds({ holds }: { holds: boolean }) {
  return holds ? (
    <span className="inline-flex items-center gap-1 font-semibold text-moss-700">
      <svg viewBox="0 0 12 12" className="h-3 w-3" aria-hidden="true">
        <path d="M2 6.5l2.5 2.5L10 3.5" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" />
      </svg>
      Holds
    </span>
  ) : (
    <span className="inline-flex items-center gap-1 font-semibold text-brick-700">
      <svg viewBox="0 0 12 12" className="h-3 w-3" aria-hidden="true">
        <path d="M3 3l6 6M9 3L3 9" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
      </svg>
      Fails
    </span>
  );
}

/** A date the same on the server and in the browser (no time-zone guessing during hydration). */
export function When({ iso }: { iso: string }) {
  const text = `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
  return <time dateTime={iso}>{text}</time>;
}

export function HashPrefix({ hash }: { hash: string }) {
  return (
    <code className="rounded bg-ink-100 px-1.5 py-0.5 font-mono text-xs text-ink-700" title={`SHA-256 ${hash}`}>
      {hash.slice(0, 12)}
    </code>
  );
}

export function Section({ title, aside, children }: { title: string; aside?: ReactNode; children: ReactNode }) {
  return (
    <section className="rounded-lg border border-ink-200 bg-white p-5">
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h2 className="font-semibold">{title}</h2>
        {aside}
      </div>
      {children}
    </section>
  );
}
