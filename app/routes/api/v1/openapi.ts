// GET /api/v1/openapi.json -> the OpenAPI 3.1 description of /api/v1 (public, like any API description).
import type { Route } from "./+types/openapi";
import { handleApi, methodNotAllowed } from "~/designs/api.server";
import { openApiDocument } from "~/api/openapi.server";

export async function loader({ request }: Route.LoaderArgs) {
  return handleApi(request, async () =>
    Response.json(openApiDocument(), { headers: { "cache-control": "public, max-age=300", "access-control-allow-origin": "*" } }),
  );
}

export async function action({ request }: Route.ActionArgs) {
  return handleApi(request, async () => methodNotAllowed("GET"));
}
