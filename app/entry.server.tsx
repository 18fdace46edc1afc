// Server rendering with a per-request nonce, so the Content-Security-Policy allows no inline script
// but the framework's own.
import { Transform, type TransformCallback } from "node:stream";
import { createReadableStreamFromReadable } from "@react-router/node";
import {
  isRouteErrorResponse,
  ServerRouter,
  type ActionFunctionArgs,
  type EntryContext,
  type RouterContextProvider,
  type LoaderFunctionArgs,
} from "react-router";
import { isbot } from "isbot";
import { renderToPipeableStream } from "react-dom/server";
import { contentSecurityPolicy } from "./lib/csp";
import { cspNonceContext } from "./load-context";
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
  loadContext: RouterContextProvider,
) {
  // A loader that lost the database half-way (after its role check) is an outage, not a bug: 503.
  if (responseStatusCode === 500 && lostDatabase.has(request)) {
    responseStatusCode = 503;
    responseHeaders.set("Retry-After", "30");
  }
  const nonce = loadContext.get(cspNonceContext);
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
        const body = new Coalesce(() => {
          clearTimeout(timeoutId);
          timeoutId = undefined;
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

/**
 * Passes React's output on in as few pieces as it was produced: everything written in one turn of
 * the event loop leaves as one chunk. React writes a page in 2 KB pieces; each piece would otherwise
 * cross the web stream, the response and the compressor separately (docs/decisions/092).
 */
class Coalesce extends Transform {
  private parts: Buffer[] = [];
  private scheduled = false;

  constructor(private readonly onEnd: () => void) {
    super();
  }

  override _transform(chunk: Buffer, _encoding: BufferEncoding, callback: TransformCallback): void {
    this.parts.push(chunk);
    if (!this.scheduled) {
      this.scheduled = true;
      setImmediate(() => this.release());
    }
    callback();
  }

  override _flush(callback: TransformCallback): void {
    this.release();
    this.onEnd();
    callback();
  }

  private release(): void {
    this.scheduled = false;
    if (this.parts.length === 0) return;
    this.push(this.parts.length === 1 ? this.parts[0] : Buffer.concat(this.parts));
    this.parts = [];
  }
}
