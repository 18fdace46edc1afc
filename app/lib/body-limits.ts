// How large a request body the pages accept, decided before any of it is read. The API (/api/...)
// reads its JSON bodies with limits of its own (api/http.server.ts, routes/api/auth.ts); pages read
// forms with request.formData(), which would otherwise hold a body of any size in memory.

/** A photo upload: the file and a little form around it (uploads.server.ts reads it with this cap). */
export const MAX_UPLOAD_BYTES = 20 * 1024 * 1024;

/**
 * A page form that is not an upload: far more than any field allows (the longest, a note, is a few
 * thousand characters), so a pasted text that is too long still reaches the form's own check and
 * its message at the field.
 */
export const PAGE_FORM_MAX_BYTES = 2 * 1024 * 1024;

const MULTIPART_MAX_BYTES = MAX_UPLOAD_BYTES + 1024 * 1024;

export type BodyRefusal = { status: 411 | 413; message: string };

const megabytes = (n: number) => `${Math.round(n / 1024 / 1024)} MB`;

/** Why a page request's body is refused before it is read, or null when it may be read. */
export function pageBodyRefusal(req: {
  method: string;
  path: string;
  contentType: string | undefined;
  contentLength: string | undefined;
  transferEncoding: string | undefined;
}): BodyRefusal | null {
  if (req.method === "GET" || req.method === "HEAD" || req.method === "OPTIONS") return null;
  if (req.path === "/api" || req.path.startsWith("/api/")) return null;
  const multipart = (req.contentType ?? "").toLowerCase().startsWith("multipart/form-data");
  const limit = multipart ? MULTIPART_MAX_BYTES : PAGE_FORM_MAX_BYTES;
  const what = multipart ? `An upload is at most ${megabytes(MAX_UPLOAD_BYTES)}` : `A form is at most ${megabytes(limit)}`;
  if (req.contentLength === undefined) {
    // Browsers send a form's length; a body without one could not be refused before it is read.
    if (req.transferEncoding !== undefined) return { status: 411, message: "A form must be sent with its length (Content-Length)." };
    return null;
  }
  const declared = Number(req.contentLength);
  if (!Number.isSafeInteger(declared) || declared < 0)
    return { status: 411, message: "The form's length (Content-Length) is not a number." };
  if (declared > limit) return { status: 413, message: `${what}; nothing was saved. Go back and send less.` };
  return null;
}
