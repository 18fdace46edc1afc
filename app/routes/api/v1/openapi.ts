// GET /api/v1/openapi.json -> the OpenAPI 3.1 description of /api/v1 (public, like any API description).
import type { Route } from "./+types/openapi";
import { handleApi, methodNotAllowed, reply } from "~/api/http.server";
import { api } from "~/api/endpoints";
import { openApiDocument } from "~/api/openapi.server";

export async function loader({ request }: Route.LoaderArgs) {
  return handleApi(request, async () => {
    const doc = openApiDocument();
    return reply(
      api.openapi,
      200,
      { ...doc, paths: doc.paths ?? {} },
      { headers: { "cache-control": "public, max-age=300", "access-control-allow-origin": "*" } },
    );
  });
}

export async function action({ request }: Route.ActionArgs) {
  return handleApi(request, async () => methodNotAllowed("GET"));
}
