// Receiving, checking, storing and serving uploaded files. A failed upload leaves nothing behind.
import { createHash } from "node:crypto";
import { and, asc, eq } from "drizzle-orm";
import { fileTypeFromBuffer } from "file-type";
import { db, schema } from "~/db/client.server";
import { recordAudit } from "~/audit/audit.server";
import { deleteObject, getObject, putObject } from "./storage.server";
import { create as contentDisposition } from "content-disposition";
import { MAX_UPLOAD_BYTES } from "~/lib/body-limits";
import { drainBody, readCapped } from "~/lib/read-body.server";
import { EMPTY_FILE, refusalOf, type FileType } from "./kinds";
import { textProblem } from "~/lib/text";

/** The longest file name kept: what common file systems allow (common practice). */
export const FILE_NAME_MAX = 255;

/** Why a file's name cannot be kept as sent, or null (the same text rules as every field, decision 101). */
export function fileNameProblem(name: string): string | null {
  if (name.length > FILE_NAME_MAX) return `Rename the file: its name is longer than ${FILE_NAME_MAX} characters. Nothing was saved.`;
  const problem = textProblem(name);
  return problem ? `Rename the file: ${problem.replace(/^Remove/, "remove")} Nothing was saved.` : null;
}

export class UploadError extends Error {
  constructor(
    public readonly field: string,
    message: string,
    public readonly status = 400,
  ) {
    super(message);
  }
}

/** The refusal of an upload over the limit. */
const tooLarge = () => new UploadError("file", `The file is too large: the limit is ${MAX_UPLOAD_BYTES / 1024 / 1024} MB.`, 413);

/**
 * Reads a multipart body with a hard size cap, so a huge upload is refused without being kept.
 * The cap covers the whole request (file plus a little form overhead).
 */
export async function readCappedFormData(request: Request, cap = MAX_UPLOAD_BYTES + 64 * 1024): Promise<FormData> {
  if (!request.body) throw new UploadError("file", "Choose a file to upload.");
  const reader = request.body.getReader();
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > cap) {
    await drainBody(reader, 4 * cap);
    throw tooLarge();
  }
  const body = await readCapped(
    reader,
    cap,
    tooLarge,
    () => new UploadError("file", "The upload was interrupted. Nothing was saved; try again."),
  );
  try {
    return await new Request(request.url, { method: "POST", headers: request.headers, body }).formData();
  } catch {
    throw new UploadError("file", "The form could not be read. Choose the file again and retry.");
  }
}

/** Checks the file by its content (never by its name), stores it, then records it; undoes the store if recording fails. */
export async function saveUpload(opts: {
  workspaceId: string;
  subjectKind: string;
  subjectId: string;
  file: FormDataEntryValue | null;
  userId: string;
  /** What the picker that sent it accepts (app/uploads/kinds.ts). */
  accept: readonly FileType[];
}) {
  const file = opts.file;
  if (!(file instanceof File) || (file.size === 0 && file.name === "")) throw new UploadError("file", "Choose a file to upload.");
  const badName = fileNameProblem(file.name);
  if (badName) throw new UploadError("file", badName);
  if (file.size === 0) throw new UploadError("file", EMPTY_FILE);
  if (file.size > MAX_UPLOAD_BYTES) throw tooLarge();
  const bytes = new Uint8Array(await file.arrayBuffer());
  const detected = await fileTypeFromBuffer(bytes);
  if (!detected || !(opts.accept as readonly string[]).includes(detected.mime)) throw new UploadError("file", refusalOf(opts.accept), 415);
  const sha256 = createHash("sha256").update(bytes).digest("hex");
  const id = crypto.randomUUID();
  const storageKey = `${opts.workspaceId}/${opts.subjectKind}/${id}`;
  const filename = (file.name || `upload.${detected.ext}`).replace(/[\r\n"\\/]/g, "_").slice(0, 200);
  await putObject(storageKey, bytes, detected.mime, sha256);
  try {
    await db.transaction(async (tx) => {
      await tx.insert(schema.upload).values({
        id,
        workspaceId: opts.workspaceId,
        subjectKind: opts.subjectKind,
        subjectId: opts.subjectId,
        storageKey,
        filename,
        contentType: detected.mime,
        size: bytes.byteLength,
        sha256,
        uploadedBy: opts.userId,
      });
      await recordAudit(
        {
          workspaceId: opts.workspaceId,
          actorId: opts.userId,
          action: "upload.created",
          subject: filename,
          detail: { subjectKind: opts.subjectKind, subjectId: opts.subjectId, sha256 },
        },
        tx,
      );
    });
  } catch (err) {
    await deleteObject(storageKey).catch(() => {});
    throw err;
  }
  return { id, filename, contentType: detected.mime, size: bytes.byteLength, sha256 };
}

export async function listUploads(workspaceId: string, subjectKind: string, subjectId: string) {
  return db
    .select({
      id: schema.upload.id,
      filename: schema.upload.filename,
      contentType: schema.upload.contentType,
      size: schema.upload.size,
      sha256: schema.upload.sha256,
      createdAt: schema.upload.createdAt,
    })
    .from(schema.upload)
    .where(
      and(eq(schema.upload.workspaceId, workspaceId), eq(schema.upload.subjectKind, subjectKind), eq(schema.upload.subjectId, subjectId)),
    )
    .orderBy(asc(schema.upload.createdAt));
}

/** The file as an HTTP response, for members of its workspace only (the caller has checked membership). */
export async function uploadResponse(workspaceId: string, uploadId: string): Promise<Response> {
  const rows = await db
    .select()
    .from(schema.upload)
    .where(and(eq(schema.upload.id, uploadId), eq(schema.upload.workspaceId, workspaceId)))
    .limit(1);
  const row = rows[0];
  if (!row) throw new Response("Not found", { status: 404 });
  const obj = await getObject(row.storageKey);
  const inline = row.contentType.startsWith("image/") || row.contentType === "application/pdf";
  return new Response(obj.body, {
    headers: {
      "content-type": row.contentType,
      "content-length": String(row.size),
      // RFC 6266: an ASCII filename for old clients and filename* (UTF-8) for the name as uploaded.
      "content-disposition": contentDisposition(row.filename, { type: inline ? "inline" : "attachment" }),
      "cache-control": "private, max-age=3600",
      "x-content-sha256": row.sha256,
      "content-security-policy": "default-src 'none'; img-src 'self'; style-src 'unsafe-inline'; sandbox",
    },
  });
}
