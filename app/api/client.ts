// The browser's one client of the JSON API: URLs from the endpoint table (app/api/endpoints.ts), and
// every answer parsed with the schema its endpoint declares for that status, so a page reads typed
// data or gets an ApiError with a sentence for people, never a shape it did not expect.
import type { z } from "zod";
import { errorSchema, type ErrorAnswer } from "./answers";
import type { Endpoint, ReplyAt, StatusOf } from "./endpoints";

type ParamNames<P extends string> = P extends `${string}{${infer N}}${infer Rest}` ? N | ParamNames<Rest> : never;
type SuccessStatus<E extends Endpoint> = Extract<StatusOf<E>, 200 | 201>;

/** The path parameters an endpoint's path names, e.g. { designId } for /api/v1/designs/{designId}. */
export type PathParams<E extends Endpoint> = Record<ParamNames<E["path"]>, string | number>;
export type Query = URLSearchParams | Record<string, string | number | readonly string[] | null | undefined>;

/** Every answer an endpoint declares, as { status, body } with the body parsed by that status's schema. */
export type Answer<E extends Endpoint> = { [S in StatusOf<E>]: { status: S; body: z.output<ReplyAt<E, S>["schema"]> } }[StatusOf<E>];
/** The body of an endpoint's success answer. */
export type Success<E extends Endpoint> = z.output<ReplyAt<E, SuccessStatus<E>>["schema"]>;

export type CallOptions<E extends Endpoint> = (ParamNames<E["path"]> extends never ? { params?: undefined } : { params: PathParams<E> }) & {
  query?: Query;
  body?: E["body"] extends z.ZodType ? z.input<E["body"]> : never;
  signal?: AbortSignal;
};

/** A failed call: the API's error (status, code, fields), or no answer at all (status 0). */
export class ApiError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly code: string,
    readonly fields: ErrorAnswer["error"]["fields"] = [],
  ) {
    super(message);
    this.name = "ApiError";
  }

  /** The first field's problem ("where: no condition ...") when there is one, else the message. */
  get detail(): string {
    const f = this.fields[0];
    return f ? `${f.path}: ${f.message}` : this.message;
  }
}

/** The URL of an endpoint with its path parameters filled in and the query appended. */
export function apiUrl<E extends Endpoint>(endpoint: E, params?: PathParams<E>, query?: Query): string {
  const path = endpoint.path.replace(/\{([A-Za-z]+)\}/g, (_, name: string) => {
    const value = (params as Record<string, string | number> | undefined)?.[name];
    if (value === undefined) throw new Error(`apiUrl: ${endpoint.path} needs ${name}`);
    return encodeURIComponent(String(value));
  });
  const search = query instanceof URLSearchParams ? query : new URLSearchParams();
  if (query && !(query instanceof URLSearchParams)) {
    for (const [k, v] of Object.entries(query)) {
      if (v === undefined || v === null) continue;
      if (Array.isArray(v)) for (const x of v) search.append(k, String(x));
      else search.set(k, String(v));
    }
  }
  const s = search.toString();
  return s ? `${path}?${s}` : path;
}

/** Reads an answer of an endpoint: the status must be one it declares, the body that status's shape. */
export async function readAnswer<E extends Endpoint>(endpoint: E, res: Response): Promise<Answer<E>> {
  const reply = (endpoint.replies as Record<number, Endpoint["replies"][number] | undefined>)[res.status];
  const media = reply?.media ?? "application/json";
  let raw: unknown;
  try {
    raw = media === "application/json" ? await res.json() : await res.text();
  } catch {
    raw = undefined;
  }
  if (!reply) throw unexpected(res.status, raw);
  const parsed = reply.schema.safeParse(raw);
  if (!parsed.success) {
    if (res.ok)
      throw new ApiError(
        `The server's answer (${res.status}) did not have the expected shape; reload the page.`,
        res.status,
        "unexpected_answer",
      );
    throw unexpected(res.status, raw);
  }
  return { status: res.status, body: parsed.data } as Answer<E>;
}

function unexpected(status: number, raw: unknown): ApiError {
  const error = errorSchema.safeParse(raw);
  if (error.success) return new ApiError(error.data.error.message, status, error.data.error.code, error.data.error.fields);
  return new ApiError(`The server answered ${status}.`, status, "unexpected_answer");
}

/**
 * Calls an endpoint and resolves with whichever declared answer came back (switch on status).
 * Rejects with an ApiError when the server cannot be reached (status 0) or answers with a status
 * or shape the endpoint does not declare.
 */
export async function callApi<E extends Endpoint>(endpoint: E, options: CallOptions<E>): Promise<Answer<E>> {
  const url = apiUrl(endpoint, options.params as PathParams<E> | undefined, options.query);
  const hasBody = options.body !== undefined;
  let res: Response;
  try {
    res = await fetch(url, {
      method: endpoint.method.toUpperCase(),
      headers: hasBody ? { "content-type": "application/json", accept: "application/json" } : { accept: "application/json" },
      body: hasBody ? JSON.stringify(options.body) : undefined,
      credentials: "same-origin",
      signal: options.signal,
    });
  } catch (e) {
    if (e instanceof DOMException && e.name === "AbortError") throw e;
    throw new ApiError("The server could not be reached; check the connection and try again.", 0, "unreachable");
  }
  return readAnswer(endpoint, res);
}

function isSuccess(status: number): boolean {
  return status >= 200 && status < 300;
}

/** The success answer's body; any other answer rejects with an ApiError carrying the API's message. */
export async function fetchApi<E extends Endpoint>(endpoint: E, options: CallOptions<E>): Promise<Success<E>> {
  const answer = await callApi(endpoint, options);
  if (isSuccess(answer.status)) return answer.body as Success<E>;
  const error = answer.body as Partial<ErrorAnswer>;
  throw new ApiError(
    error.error?.message ?? `The server answered ${answer.status}.`,
    answer.status,
    error.error?.code ?? "error",
    error.error?.fields ?? [],
  );
}

/** An swr fetcher of an endpoint's GET answers, keyed by the URL apiUrl made. */
export function apiFetcher<E extends Endpoint>(endpoint: E): (url: string) => Promise<Success<E>> {
  return async (url) => {
    let res: Response;
    try {
      res = await fetch(url, { headers: { accept: "application/json" }, credentials: "same-origin" });
    } catch {
      throw new ApiError("The server could not be reached; check the connection and try again.", 0, "unreachable");
    }
    const answer = await readAnswer(endpoint, res);
    if (isSuccess(answer.status)) return answer.body as Success<E>;
    const error = answer.body as Partial<ErrorAnswer>;
    throw new ApiError(
      error.error?.message ?? `The server answered ${answer.status}.`,
      answer.status,
      error.error?.code ?? "error",
      error.error?.fields ?? [],
    );
  };
}
