// The content hash of a design document: SHA-256 (hex) of its canonical JSON (app/lib/canonical-json.ts,
// docs/decisions/032). Key order and formatting of the request therefore do not matter, and the hash
// can be recomputed from the stored jsonb.
import { createHash } from "node:crypto";
import { canonicalJson } from "~/lib/canonical-json";

export function contentHash(document: unknown): string {
  return createHash("sha256").update(canonicalJson(document), "utf8").digest("hex");
}
