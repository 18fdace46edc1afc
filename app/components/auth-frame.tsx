import type { ReactNode } from "react";
import { Link } from "react-router";
import { Logo } from "./logo";

export function AuthFrame({ title, children, footer }: { title: string; children: ReactNode; footer?: ReactNode }) {
  return (
    <main className="flex min-h-screen flex-col items-center justify-center px-4 py-10">
      <Link to="/" className="text-ink-800" aria-label="Chainproof home">
        <Logo />
      </Link>
      <div className="mt-6 w-full max-w-sm rounded-xl border border-ink-200 bg-white p-6 shadow-sm">
        <h1 className="text-xl font-semibold">{title}</h1>
        <div className="mt-5">{children}</div>
      </div>
      {footer ? <div className="mt-4 text-sm text-ink-600">{footer}</div> : null}
    </main>
  );
}
