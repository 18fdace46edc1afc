import { Links, Meta, Outlet, Scripts, ScrollRestoration, useRouteLoaderData } from "react-router";
import type { Route } from "./+types/root";
import "./app.css";
import { PageError } from "./components/error-boundary";
import { cspNonceContext } from "./load-context";

export const meta: Route.MetaFunction = () => [
  { title: "Chainproof" },
  { name: "description", content: "Design, prove, review and test the drive-inhibit chain of small electric vehicles." },
];

export const links: Route.LinksFunction = () => [{ rel: "icon", href: "/favicon.svg", type: "image/svg+xml" }];

export async function loader({ context }: Route.LoaderArgs) {
  // Public: only the nonce the server entry already put in this response's policy.
  return { cspNonce: context.get(cspNonceContext) };
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
  // Errors outside a section's own boundary (sign-in pages, an unknown URL, a workspace you are not in).
  return <PageError error={error} />;
}
