// The report's query, read the same way by the page and its PDF: the paper and the revision to compare
// with. A bad value, the reported revision itself or a revision the design does not have is a 400
// naming the field, never a silent fall-back to another comparison.
import type { Size } from "~/components/report/paper";
import { revisionRef } from "./compiled.server";
import { reportQuerySchema } from "./forms";

export async function reportQuery(
  request: Request,
  workspaceId: string,
  designId: string,
  number: number,
): Promise<{ size: Size; compare: number | null }> {
  const parsed = reportQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!parsed.success) throw new Response(parsed.error.issues[0]!.message, { status: 400, statusText: "Bad request" });
  const { size, compare } = parsed.data;
  if (compare === undefined) return { size, compare: null };
  if (compare === number)
    throw new Response(`compare: choose a revision other than ${number}, the one reported.`, { status: 400, statusText: "Bad request" });
  if (!(await revisionRef(workspaceId, designId, compare)))
    throw new Response(`compare: this design has no revision ${compare}.`, { status: 400, statusText: "Bad request" });
  return { size, compare };
}
