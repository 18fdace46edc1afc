// Canonical JSON (docs/decisions/032): the JSON Canonicalization Scheme of RFC 8785 for the values
// a JSON body can carry: object keys sorted by UTF-16 code units, no whitespace, numbers and strings
// written as JavaScript's JSON.stringify writes them. One function for the content hash of designs
// and records and for the revision comparison, so "the same document" means one thing everywhere.
// Pure: the browser (comparison) and the server (hashes) both use it.

export function canonicalJson(value: unknown): string {
  if (value === null || typeof value === "boolean" || typeof value === "string") return JSON.stringify(value);
  if (typeof value === "number") {
    if (!Number.isFinite(value)) throw new TypeError("canonical JSON has no NaN or Infinity");
    return JSON.stringify(value);
  }
  if (Array.isArray(value)) return `[${value.map((v) => (v === undefined ? "null" : canonicalJson(v))).join(",")}]`;
  if (typeof value === "object") {
    const obj = value as Record<string, unknown>;
    const parts: string[] = [];
    // Default sort compares UTF-16 code units, as RFC 8785 section 3.2.3 asks.
    for (const key of Object.keys(obj).sort()) {
      if (obj[key] === undefined) continue;
      parts.push(`${JSON.stringify(key)}:${canonicalJson(obj[key])}`);
    }
    return `{${parts.join(",")}}`;
  }
  throw new TypeError(`canonical JSON cannot hold a ${typeof value}`);
}
