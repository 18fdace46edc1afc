// The S3-compatible bucket (a local fake in development and tests; a real bucket in production).
import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { env } from "~/env.server";

const s3 = new S3Client({
  endpoint: env.S3_ENDPOINT,
  region: env.S3_REGION,
  forcePathStyle: true,
  credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
});

export async function putObject(key: string, body: Uint8Array, contentType: string, sha256: string) {
  await s3.send(new PutObjectCommand({ Bucket: env.S3_BUCKET, Key: key, Body: body, ContentType: contentType, Metadata: { sha256 } }));
}

export async function getObject(key: string): Promise<{ body: ReadableStream<Uint8Array>; length?: number }> {
  const out = await s3.send(new GetObjectCommand({ Bucket: env.S3_BUCKET, Key: key }));
  if (!out.Body) throw new Error("empty object");
  return { body: out.Body.transformToWebStream() as ReadableStream<Uint8Array>, length: out.ContentLength };
}

export async function deleteObject(key: string) {
  await s3.send(new DeleteObjectCommand({ Bucket: env.S3_BUCKET, Key: key }));
}
