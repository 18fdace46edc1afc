// Server rendering with a per-request nonce, so the Content-Security-Policy allows no inline script
// but the framework's own.
import { PassThrough } from "node:stream";
import { createReadableStreamFromReadable } from "@react-router/node";
import { isRouteErrorResponse, ServerRouter, type ActionFunctionArgs, type AppLoadContext, type EntryContext, type LoaderFunctionArgs } from "react-router";
import { isbot } from "isbot";
import { renderToPipeableStream } from "react-dom/server";
import { contentSecurityPolicy } from "./lib/csp";
import { isDatabaseDown } from "./db/unavailable.server";

export const streamTimeout = 5_000;

// Requests whose loader or action failed because the database was unreachable (seen before errors are sanitized).
const lostDatabase = new WeakSet<Request>();

export function handleError(error: unknown, { request }: LoaderFunctionArgs | ActionFunctionArgs) {
  if (isDatabaseDown(error)) {
    lostDatabase.add(request);
    return;
  }
  // A "not found" or "forbidden" is an answer, not a fault of the server: only faults are logged.
  if (isRouteErrorResponse(error) && error.status < 500) return;
  if (!request.signal.aborted) console.error(error);
}

export default function handleRequest(
  request: Request,
  responseStatusCode: number,
  responseHeaders: Headers,
  routerContext: EntryContext,
  loadContext: AppLoadContext,
) {
  // A loader that lost the database half-way (after its role check) is an outage, not a bug: 503.
  if (responseStatusCode === 500 && lostDatabase.has(request)) {
    responseStatusCode = 503;
    responseHeaders.set("Retry-After", "30");
  }
  const nonce = loadContext?.cspNonce;
  if (nonce) responseHeaders.set("Content-Security-Policy", contentSecurityPolicy(nonce));
  if (request.method.toUpperCase() === "HEAD") {
    return new Response(null, { status: responseStatusCode, headers: responseHeaders });
  }
  return new Promise<Response>((resolve, reject) => {
    let shellRendered = false;
    const userAgent = request.headers.get("user-agent");
    const readyOption = (userAgent && isbot(userAgent)) || routerContext.isSpaMode ? "onAllReady" : "onShellReady";
    let timeoutId: ReturnType<typeof setTimeout> | undefined = setTimeout(() => abort(), streamTimeout + 1000);
    const { pipe, abort } = renderToPipeableStream(<ServerRouter context={routerContext} url={request.url} nonce={nonce} />, {
      nonce,
      [readyOption]() {
        shellRendered = true;
        const body = new PassThrough({
          final(callback) {
            clearTimeout(timeoutId);
            timeoutId = undefined;
            callback();
          },
        });
        responseHeaders.set("Content-Type", "text/html");
        pipe(body);
        resolve(new Response(createReadableStreamFromReadable(body), { headers: responseHeaders, status: responseStatusCode }));
      },
      onShellError(error: unknown) {
        reject(error);
      },
      onError(error: unknown) {
        responseStatusCode = 500;
        if (shellRendered) console.error(error);
      },
    });
  });
}
