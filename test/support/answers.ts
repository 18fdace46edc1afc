// Checks an answer of the JSON API against the endpoint table (app/api/endpoints.ts): the status
// must be one the endpoint declares and the body must parse with that status's schema. The
// integration and fault suites run every fetch to /api/v1 through this (see check-answers.ts).
import { z } from "zod";
import { endpointOf, servesPath } from "../../app/api/endpoints";
import { errorSchema } from "../../app/api/answers";

/** Statuses any path of the API may answer to a method it does not serve. */
const UNSERVED_METHOD = new Set([405, 429, 503]);

/** Endpoint answers checked so far in this test file, as "METHOD /api/v1/path STATUS" (for the coverage count). */
export const seenAnswers = new Set<string>();

export class AnswerMismatch extends Error {
  constructor(message: string) {
    super(message);
    this.name = "AnswerMismatch";
  }
}

/**
 * Throws an AnswerMismatch when the answer breaks the contract. Paths no endpoint serves (pages
 * such as /api/v1/docs, unknown URLs) are not API answers and pass. Returns what was checked.
 */
export async function checkAnswer(method: string, pathname: string, res: Response): Promise<"checked" | "not-an-endpoint"> {
  const m = method.toUpperCase();
  if (m === "HEAD" || m === "OPTIONS") return "not-an-endpoint";
  const where = `${m} ${pathname} answered ${res.status}`;
  const endpoint = endpointOf(m, pathname);
  if (!endpoint) {
    if (!servesPath(pathname)) return "not-an-endpoint";
    if (!UNSERVED_METHOD.has(res.status))
      throw new AnswerMismatch(`${where}; no endpoint serves ${m} there, so only 405, 429 or 503 may come back`);
    await expectShape(where, res, errorSchema);
    return "checked";
  }
  const reply = endpoint.replies[res.status];
  if (reply) seenAnswers.add(`${endpoint.method.toUpperCase()} ${endpoint.path} ${res.status}`);
  if (!reply) {
    const declared = Object.keys(endpoint.replies).join(", ");
    throw new AnswerMismatch(
      `${where}, which ${endpoint.method.toUpperCase()} ${endpoint.path} does not declare (it declares ${declared}): ${await res.text()}`,
    );
  }
  if (reply.media === "text/csv") {
    const type = res.headers.get("content-type") ?? "";
    // The test reads the body itself; this copy is let go (not awaited: a tee branch's cancel settles only with the other).
    void res.body?.cancel().catch(() => {});
    if (!type.startsWith("text/csv")) throw new AnswerMismatch(`${where} with content-type ${JSON.stringify(type)}, not text/csv`);
    return "checked";
  }
  await expectShape(where, res, reply.schema);
  return "checked";
}

async function expectShape(where: string, res: Response, schema: z.ZodType): Promise<void> {
  const text = await res.text();
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw new AnswerMismatch(`${where} with a body that is not JSON: ${text.slice(0, 200)}`);
  }
  const parsed = schema.safeParse(body);
  if (!parsed.success) {
    throw new AnswerMismatch(
      `${where} with a body that does not match its schema:\n${z.prettifyError(parsed.error)}${unionDetails(parsed.error)}\nbody: ${text.slice(0, 500)}`,
    );
  }
}

/** zod sums up a failed union as "Invalid input": add what each alternative found wrong (a 409 is one of two shapes). */
function unionDetails(error: z.ZodError): string {
  const lines: string[] = [];
  for (const issue of error.issues) {
    if (issue.code !== "invalid_union") continue;
    issue.errors.forEach((branch, i) => {
      for (const b of branch) lines.push(`  alternative ${i + 1}: ${b.message} at ${[...issue.path, ...b.path].join(".") || "(root)"}`);
    });
  }
  return lines.length > 0 ? `\n${lines.join("\n")}` : "";
}
