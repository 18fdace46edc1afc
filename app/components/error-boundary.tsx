// What a page says when it cannot be shown: a 404 or 403 thrown by a loader, another status, or an
// unexpected error. Sections render it inside their own frame (the workspace shell keeps its
// navigation, the report stays a sheet of paper), so one failing page does not take the app with it.
import type { ReactNode } from "react";
import { isRouteErrorResponse, useRouteError } from "react-router";
import { LogoMark } from "./logo";

export type ErrorText = { status: number | null; title: string; detail: string; stack?: string };

/** Title and sentence for what a route threw; the stack only in development. */
export function describeError(error: unknown): ErrorText {
  if (isRouteErrorResponse(error)) {
    const detail =
      error.status === 404
        ? "There is nothing here, or it belongs to a workspace you are not a member of."
        : typeof error.data === "string" && error.data
          ? error.data
          : error.statusText || "The page could not be shown.";
    const title = error.status === 404 ? "Not found" : error.status === 403 ? "Not allowed" : `Error ${error.status}`;
    // A 404 that names what is missing ("This design has no revision 9.") says it better.
    return {
      status: error.status,
      title,
      detail: error.status === 404 && typeof error.data === "string" && error.data && error.data !== "Not found" ? error.data : detail,
    };
  }
  const text: ErrorText = {
    status: null,
    title: "Something went wrong",
    detail: "The page could not be shown. Try again; if it keeps happening, tell your workspace admin.",
  };
  if (import.meta.env.DEV && error instanceof Error) {
    text.detail = error.message;
    text.stack = error.stack;
  }
  return text;
}

/** The error of the route that threw, as a section of the page around it. */
export function SectionError({ back }: { back?: ReactNode }) {
  const e = describeError(useRouteError());
  return (
    <section role="alert" aria-labelledby="cp-error-title" className="mx-auto max-w-xl py-10" data-error-status={e.status ?? "error"}>
      <h1 id="cp-error-title" className="text-2xl font-semibold">
        {e.title}
      </h1>
      <p className="mt-3 text-ink-700 [overflow-wrap:anywhere]">{e.detail}</p>
      {back ? <p className="mt-6">{back}</p> : null}
      {e.stack ? <pre className="mt-8 overflow-x-auto rounded bg-subtle p-4 text-xs">{e.stack}</pre> : null}
    </section>
  );
}

/** A page of its own, for errors no section can frame (a workspace that does not exist or is not yours). */
export function PageError({ error }: { error: unknown }) {
  const { title, detail, stack } = describeError(error);
  return (
    <main className="mx-auto max-w-xl px-6 py-16">
      <LogoMark className="h-10 w-10 text-ink-800" />
      <h1 className="mt-6 text-2xl font-semibold">{title}</h1>
      <p className="mt-3 text-ink-700 [overflow-wrap:anywhere]">{detail}</p>
      <p className="mt-6">
        <a href="/" className="font-semibold text-action-ink underline">
          Back to Chainproof
        </a>
      </p>
      {stack ? <pre className="mt-8 overflow-x-auto rounded bg-subtle p-4 text-xs">{stack}</pre> : null}
    </main>
  );
}
