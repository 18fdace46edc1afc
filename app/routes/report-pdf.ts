// GET /w/:ws/designs/:designId/revisions/:number/report.pdf?size=a4|letter&compare=N -> the printed report (members only).
import type { Route } from "./+types/report-pdf";
import { requireRevisionPage } from "~/reviews/access.server";
import { printPdf, PrintBusyError } from "~/reviews/pdf.server";
import { reportPath } from "~/reviews/paths";
import { reportQuery } from "~/reviews/report-query.server";
import { create as contentDisposition } from "content-disposition";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  const { member, design, ref } = await requireRevisionPage(context, params, "workspace.view");
  // Checked here too (400 naming the field), so a bad query is never printed as an error page.
  const { size, compare } = await reportQuery(request, member.workspace.id, design.id, ref.number);
  let pdf: Buffer;
  try {
    pdf = await printPdf(
      reportPath(member.workspace.slug, design.id, ref.number, size, compare),
      request.headers.get("cookie") ?? "",
      size === "letter" ? "Letter" : "A4",
      {
        userId: member.user.id,
        signal: request.signal,
      },
    );
  } catch (e) {
    if (e instanceof PrintBusyError) throw new Response(e.message, { status: 429, headers: { "retry-after": "5" } });
    // The requester has gone: nobody reads the answer.
    if (request.signal.aborted) throw new Response("The request was cancelled.", { status: 499 });
    console.error("report PDF:", e);
    throw new Response("The PDF could not be made just now. Print the report page from the browser instead, or try again.", {
      status: 503,
    });
  }
  const base =
    design.name
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-|-$/g, "")
      .slice(0, 60) || "design";
  return new Response(new Uint8Array(pdf), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": contentDisposition(`${base}-r${ref.number}${compare ? `-vs-r${compare}` : ""}-report-${size}.pdf`),
      "cache-control": "private, no-store",
    },
  });
}
