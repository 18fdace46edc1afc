// Photo and PDF uploads: type checked by content, size limit, checksum, workspace-only downloads,
// and nothing left behind by a refused or interrupted upload.
import { createHash } from "node:crypto";
import http from "node:http";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { ListObjectsV2Command, S3Client } from "@aws-sdk/client-s3";
import { BASE_URL, DEMO, formBody, signIn, type Client } from "../support/http";
import { createOutsider } from "../support/outsider";

// A 1×1 PNG (PNG signature per ISO/IEC 15948:2004, 5.2).
const PNG = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAQAAAC1HAwCAAAAC0lEQVR42mNkYAAAAAYAAjCB0C8AAAAASUVORK5CYII=", "base64");

let db: pg.Client;
let vehicleId: string;
let workspaceId: string;
let technician: Client;

async function countUploads() {
  const r = await db.query("SELECT count(*)::int AS n FROM upload WHERE workspace_id = $1", [workspaceId]);
  return r.rows[0].n as number;
}

async function countObjects() {
  const s3 = new S3Client({
    endpoint: process.env.S3_ENDPOINT,
    region: "us-east-1",
    forcePathStyle: true,
    credentials: { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" },
  });
  const out = await s3.send(new ListObjectsV2Command({ Bucket: process.env.S3_BUCKET ?? "chainproof-uploads", Prefix: `${workspaceId}/` }));
  return out.KeyCount ?? 0;
}

function upload(c: Client, bytes: Uint8Array, name: string, type: string) {
  const form = new FormData();
  form.set("intent", "upload-photo");
  form.set("file", new File([bytes as BlobPart], name, { type }));
  return c.fetch(`/w/larkspur/vehicles/${vehicleId}`, { method: "POST", body: form });
}

beforeAll(async () => {
  db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
  const r = await db.query(
    "SELECT v.id, v.workspace_id FROM vehicle v JOIN workspace w ON w.id = v.workspace_id WHERE w.slug = 'larkspur' ORDER BY v.name LIMIT 1",
  );
  vehicleId = r.rows[0].id;
  workspaceId = r.rows[0].workspace_id;
  technician = await signIn(DEMO.technician);
});

afterAll(async () => {
  await db.end();
});

describe("uploads", () => {
  it("stores a photo with its checksum and serves the same bytes to members", async () => {
    const before = await countUploads();
    const res = await upload(technician, PNG, "stand-switch.png", "image/png");
    expect(res.status).toBe(200);
    expect(await countUploads()).toBe(before + 1);
    const row = (
      await db.query("SELECT id, sha256, content_type, size FROM upload WHERE workspace_id = $1 ORDER BY created_at DESC LIMIT 1", [
        workspaceId,
      ])
    ).rows[0];
    expect(row.sha256).toBe(createHash("sha256").update(PNG).digest("hex"));
    expect(row.content_type).toBe("image/png");
    const reviewer = await signIn(DEMO.reviewer);
    const got = await reviewer.fetch(`/w/larkspur/files/${row.id}`);
    expect(got.status).toBe(200);
    expect(got.headers.get("content-type")).toBe("image/png");
    expect(Buffer.from(await got.arrayBuffer()).equals(PNG)).toBe(true);
    // Another workspace's member cannot download it, nor tell that it exists.
    const outsider = await createOutsider();
    expect((await outsider.client.fetch(`/w/larkspur/files/${row.id}`)).status).toBe(404);
    expect((await outsider.client.fetch(`/w/${outsider.slug}/files/${row.id}`)).status).toBe(404);
  });

  it("refuses a file whose content is not a photo or PDF, whatever its name", async () => {
    const before = [await countUploads(), await countObjects()];
    const res = await upload(technician, Buffer.from("#!/bin/sh\necho not a photo\n"), "photo.jpg", "image/jpeg");
    expect(res.status).toBe(415);
    expect(await res.text()).toContain("checked by the file");
    expect([await countUploads(), await countObjects()]).toEqual(before);
  });

  it("says an empty file is empty, and a refusal lists exactly what the picker accepts", async () => {
    const before = [await countUploads(), await countObjects()];
    const empty = await upload(technician, new Uint8Array(0), "blank.jpg", "image/jpeg");
    expect(empty.status).toBe(400);
    expect(await empty.text()).toContain("The file is empty (0 bytes).");
    // The vehicle's picker offers photos and PDF documents: its accept attribute and its refusal agree.
    const page = await (await technician.fetch(`/w/larkspur/vehicles/${vehicleId}`)).text();
    expect(page).toContain('accept="image/jpeg,image/png,image/webp,application/pdf"');
    const text = await (await upload(technician, Buffer.from("plain text"), "notes.txt", "text/plain")).text();
    expect(text).toContain("Accepted: JPEG, PNG, WebP or PDF files");
    expect([await countUploads(), await countObjects()]).toEqual(before);
  });

  it("a bench step's photo picker takes photos only, and its refusal says so exactly", async () => {
    // The demo hauler has a released revision, so it has a bench procedure.
    const hauler = (await db.query("SELECT id FROM vehicle WHERE workspace_id = $1 AND name = 'Haybarn campus hauler #3'", [workspaceId]))
      .rows[0].id as string;
    const started = await technician.fetch(`/w/larkspur/vehicles/${hauler}`, formBody({ intent: "start-bench-run" }));
    const runPath = started.headers.get("location") ?? "";
    expect(runPath).toMatch(/\/bench-tests\//);
    const page = await (await technician.fetch(runPath)).text();
    expect(page).toContain('accept="image/jpeg,image/png,image/webp"');
    const form = new FormData();
    form.set("intent", "photo");
    form.set("step", "1");
    // A real PDF header: accepted for a vehicle, not for a step.
    form.set(
      "file",
      new File([Buffer.from("%PDF-1.4\n%\xE2\xE3\xCF\xD3\n1 0 obj\n<<>>\nendobj\ntrailer\n<<>>\n%%EOF\n", "latin1")], "wiring.pdf", {
        type: "application/pdf",
      }),
    );
    const res = await technician.fetch(runPath, { method: "POST", body: form });
    expect(res.status).toBe(415);
    const text = await res.text();
    expect(text).toContain("Accepted: JPEG, PNG or WebP files");
    expect(text).not.toContain("PDF files");
    const empty = new FormData();
    empty.set("intent", "photo");
    empty.set("step", "1");
    empty.set("file", new File([], "photo.jpg", { type: "image/jpeg" }));
    const res2 = await technician.fetch(runPath, { method: "POST", body: empty });
    expect(res2.status).toBe(400);
    expect(await res2.text()).toContain("The file is empty (0 bytes).");
  });

  it("refuses a file over 20 MB and keeps nothing", async () => {
    const before = [await countUploads(), await countObjects()];
    const big = new Uint8Array(21 * 1024 * 1024);
    big.set(PNG, 0);
    const res = await upload(technician, big, "huge.png", "image/png");
    expect(res.status).toBe(413);
    expect([await countUploads(), await countObjects()]).toEqual(before);
  });

  it("a reviewer may not upload to a vehicle", async () => {
    const reviewer = await signIn(DEMO.reviewer);
    expect((await upload(reviewer, PNG, "x.png", "image/png")).status).toBe(403);
  });

  it("an upload interrupted half-way leaves no record and no object", async () => {
    const before = [await countUploads(), await countObjects()];
    const boundary = "----chainproof-test";
    const head = Buffer.from(
      `--${boundary}\r\nContent-Disposition: form-data; name="intent"\r\n\r\nupload-photo\r\n--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="cut.png"\r\nContent-Type: image/png\r\n\r\n`,
    );
    const url = new URL(`/w/larkspur/vehicles/${vehicleId}`, BASE_URL);
    await new Promise<void>((resolve) => {
      const req = http.request(url, {
        method: "POST",
        headers: {
          cookie: technician.cookie,
          "x-forwarded-for": technician.ip,
          origin: BASE_URL,
          "content-type": `multipart/form-data; boundary=${boundary}`,
          "content-length": String(head.length + PNG.length + 5_000_000),
        },
      });
      req.on("error", () => resolve());
      req.on("close", () => resolve());
      req.write(head);
      req.write(PNG);
      req.write(Buffer.alloc(100_000));
      setTimeout(() => req.destroy(), 300);
    });
    await new Promise((r) => setTimeout(r, 500));
    expect([await countUploads(), await countObjects()]).toEqual(before);
  });
});
