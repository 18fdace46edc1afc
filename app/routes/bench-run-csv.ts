// GET /w/:ws/bench-tests/:runId/results.csv -> every step of a bench run with its result (members).
// The caution comes first: people act on this sheet at the vehicle.
import type { Route } from "./+types/bench-run-csv";
import { create as contentDisposition } from "content-disposition";
import { requireCan } from "~/auth/context.server";
import { getRun } from "~/bench-runs/bench-runs.server";
import { benchRunCsv } from "~/bench-runs/csv";
import { runJson } from "~/api/views.server";

export async function loader({ params, context }: Route.LoaderArgs) {
  const m = requireCan(context, "workspace.view");
  const run = await getRun(m.workspace.id, params.runId);
  if (!run) throw new Response("Not found", { status: 404 });
  const json = runJson(run, m.workspace.slug);
  const base =
    run.vehicleName
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-|-$/g, "")
      .slice(0, 60) || "vehicle";
  return new Response(benchRunCsv(json), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": contentDisposition(`${base}-bench-test-${run.run.startedAt.toISOString().slice(0, 10)}.csv`),
      "cache-control": "private, no-store",
    },
  });
}
