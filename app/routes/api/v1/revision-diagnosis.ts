// POST /api/v1/designs/:designId/revisions/:number/diagnosis { states, measured?, history? }
//   -> { diagnosis, readings }   (the engine's diagnose of that row, and with measured input
//   readings its explainReadings: which single contact fault would explain them; any member)
import type { Route } from "./+types/revision-diagnosis";
import { apiError, handleApi, methodNotAllowed, reply, requireMethod } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { diagnose, explainReadings, rowProblems } from "~/engine";
import type { FieldProblem } from "~/designs/types";
import { requireRevisionApi } from "~/reviews/access.server";
import { parseBody } from "~/api/access.server";
import { diagnosisBodySchema } from "~/api/schemas";

export async function loader({ request }: Route.LoaderArgs) {
  return handleApi(request, async () => methodNotAllowed("POST"));
}

export async function action({ request, params, context }: Route.ActionArgs) {
  return handleApi(request, async () => {
    requireMethod(request, "POST");
    const { compiled } = await requireRevisionApi(context, request, params.designId, params.number, "workspace.view");
    const body = await parseBody(request, diagnosisBodySchema, "diagnosis request");
    // The engine says whether a row is complete and every state exists; we only attach the path.
    const problems: FieldProblem[] = rowProblems(compiled, body.states).map((message) => ({ path: "states", message }));
    (body.history ?? []).forEach((row, i) => {
      for (const message of rowProblems(compiled, row)) problems.push({ path: `history[${i}]`, message });
    });
    for (const id of Object.keys(body.measured ?? {})) {
      if (!(id in compiled.inputIndex)) problems.push({ path: `measured.${id}`, message: `no input with id ${JSON.stringify(id)}` });
    }
    if (problems.length > 0) return apiError(400, "invalid_body", "The row does not fit this revision's conditions and inputs.", problems);
    const diagnosis = diagnose(compiled, body.states, body.history ? { history: body.history } : {});
    const readings = body.measured ? explainReadings(compiled, body.states, body.measured) : null;
    return reply(api.diagnoseRow, 200, { diagnosis, readings });
  });
}
