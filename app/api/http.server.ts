// Plumbing of the JSON API (/api/v1): answering as an endpoint of app/api/endpoints.ts declares
// (reply), the error shape, reading a JSON body safely, and a wrapper that turns anything
// unexpected into a JSON 500 instead of an HTML page.
import type { z } from "zod";
import { databaseDownResponse, isDatabaseDown } from "~/db/unavailable.server";
import { formatPath } from "~/engine";
import { withRateLimit } from "~/api/api-rate-limit.server";
import type { ErrorAnswer } from "./answers";
import type { Endpoint, ReplyAt, StatusOf } from "./endpoints";
import type { FieldProblem } from "~/designs/types";
import { readCapped } from "~/lib/read-body.server";

/** The body an endpoint's answer of a status carries (before JSON). */
export type BodyOf<E extends Endpoint, S extends StatusOf<E>> = z.input<ReplyAt<E, S>["schema"]>;

/**
 * The answer of an endpoint: the status must be one it declares and the body must have that
 * status's shape (the compiler checks it; the integration tests check every answer at run time).
 */
export function reply<E extends Endpoint, S extends StatusOf<E>>(
  _endpoint: E,
  status: S,
  body: BodyOf<E, S>,
  init: Omit<ResponseInit, "status"> = {},
): Response {
  return Response.json(body, { ...init, status });
}

/** The path of a problem with the whole body or document. */
export const ROOT_PATH = "(root)";

export function apiError(
  status: number,
  code: string,
  message: string,
  fields: FieldProblem[] = [],
  extra: Record<string, unknown> = {},
): Response {
  // A field path is never empty: the body or document itself is "(root)", as on the command line.
  const named = fields.map((f) => (f.path === "" ? { ...f, path: ROOT_PATH } : f));
  const body: ErrorAnswer & Record<string, unknown> = { error: { code, message, fields: named }, ...extra };
  return Response.json(body, { status });
}

export function zodFields(error: z.ZodError): FieldProblem[] {
  return error.issues.map((i) => ({ path: formatPath(i.path), message: i.message }));
}

/**
 * Runs an API handler under the per-client rate limit (429, docs/decisions/080); a thrown Response is
 * the answer, anything else becomes a JSON 500.
 */
export async function handleApi(request: Request, run: () => Promise<Response>): Promise<Response> {
  return withRateLimit(request, async () => {
    try {
      return await run();
    } catch (e) {
      // The pool reports an unreachable database as a 503 page response; the API answers it in JSON.
      if (e instanceof Response)
        return e.status === 503 && !e.headers.get("content-type")?.includes("json") ? databaseDownResponse("api") : e;
      if (isDatabaseDown(e)) return databaseDownResponse("api");
      console.error("design API:", e);
      return apiError(500, "internal", "The server could not complete this request. Nothing was saved; try again.");
    }
  });
}

export function methodNotAllowed(...allowed: string[]): Response {
  return Response.json(
    { error: { code: "method_not_allowed", message: `Use ${allowed.join(" or ")} here.`, fields: [] } },
    { status: 405, headers: { allow: allowed.join(", ") } },
  );
}

export function requireMethod(request: Request, ...allowed: string[]): void {
  if (!allowed.includes(request.method)) throw methodNotAllowed(...allowed);
}

/**
 * Reads the request body as JSON, at most maxBytes. Throws a JSON error Response (415, 413 or 400)
 * for a body that is not JSON, too large, not UTF-8 or malformed.
 */
export async function readJsonBody(request: Request, maxBytes: number): Promise<unknown> {
  const type = (request.headers.get("content-type") ?? "").split(";")[0]!.trim().toLowerCase();
  // JSON only: a cross-site HTML form cannot send this content type, which keeps these endpoints out of reach of forged forms.
  if (type !== "application/json" && !type.endsWith("+json")) {
    throw apiError(415, "unsupported_media_type", 'Send the body as JSON with the header "Content-Type: application/json".');
  }
  const tooLarge = () => apiError(413, "too_large", `The request body is larger than ${maxBytes.toLocaleString("en-US")} bytes.`);
  const declared = Number(request.headers.get("content-length"));
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge();
  const bytes = request.body ? await readCapped(request.body.getReader(), maxBytes, tooLarge) : new Uint8Array(0);
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw apiError(400, "invalid_json", "The request body is not valid UTF-8 text.");
  }
  if (text.trim() === "") throw apiError(400, "invalid_json", "The request body is empty; send a JSON object.");
  try {
    return JSON.parse(text);
  } catch (e) {
    const detail = e instanceof Error ? e.message : "parse error";
    throw apiError(400, "invalid_json", `The request body is not valid JSON (${detail}).`);
  }
}
