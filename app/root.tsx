import { isRouteErrorResponse, Links, Meta, Outlet, Scripts, ScrollRestoration, useRouteLoaderData } from "react-router";
import type { Route } from "./+types/root";
import "./app.css";
import { LogoMark } from "./components/logo";

export const meta: Route.MetaFunction = () => [
  { title: "Chainproof" },
  { name: "description", content: "Design, prove, review and test the drive-inhibit chain of small electric vehicles." },
];

export const links: Route.LinksFunction = () => [{ rel: "icon", href: "/favicon.svg", type: "image/svg+xml" }];

export async function loader({ context }: Route.LoaderArgs) {
  // Public: only the nonce the server entry already put in this response's policy.
  return { cspNonce: context?.cspNonce };
}

export function Layout({ children }: { children: React.ReactNode }) {
  const nonce = useRouteLoaderData<typeof loader>("root")?.cspNonce;
  return (
    <html lang="en">
      <head>
        <meta charSet="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <Meta />
        <Links />
      </head>
      <body className="min-h-screen font-sans">
        {children}
        <ScrollRestoration nonce={nonce} />
        <Scripts nonce={nonce} />
      </body>
    </html>
  );
}

export default function App() {
  return <Outlet />;
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  let title = "Something went wrong";
  let detail = "The page could not be shown. Try again; if it keeps happening, tell your workspace admin.";
  let stack: string | undefined;
  if (isRouteErrorResponse(error)) {
    title = error.status === 404 ? "Not found" : error.status === 403 ? "Not allowed" : `Error ${error.status}`;
    detail =
      error.status === 404
        ? "There is nothing here, or it belongs to a workspace you are not a member of."
        : typeof error.data === "string" && error.data
          ? error.data
          : error.statusText || detail;
  } else if (import.meta.env.DEV && error instanceof Error) {
    detail = error.message;
    stack = error.stack;
  }
  return (
    <main className="mx-auto max-w-xl px-6 py-16">
      <LogoMark className="h-10 w-10 text-ink-800" />
      <h1 className="mt-6 text-2xl font-semibold">{title}</h1>
      <p className="mt-3 text-ink-700">{detail}</p>
      <p className="mt-6">
        <a href="/" className="font-semibold text-copper-700 underline">
          Back to Chainproof
        </a>
      </p>
      {stack ? <pre className="mt-8 overflow-x-auto rounded bg-ink-100 p-4 text-xs">{stack}</pre> : null}
    </main>
  );
}
