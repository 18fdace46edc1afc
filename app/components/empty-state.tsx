import type { ReactNode } from "react";

export function EmptyState({ title, children, action }: { title: string; children: ReactNode; action?: ReactNode }) {
  return (
    <div className="rounded-lg border border-dashed border-ink-300 bg-white px-6 py-10 text-center">
      <h2 className="text-base font-semibold text-ink-900">{title}</h2>
      <div className="mx-auto mt-2 max-w-prose text-sm text-ink-600">{children}</div>
      {action ? <div className="mt-5">{action}</div> : null}
    </div>
  );
}
