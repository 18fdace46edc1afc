// Downloads an uploaded file: members of its workspace only; anyone else gets 404.
import type { Route } from "./+types/file";
import { requireCan } from "~/auth/context.server";
import { uploadResponse } from "~/uploads/uploads.server";

export async function loader({ params, context }: Route.LoaderArgs) {
  const m = requireCan(context, "workspace.view");
  return uploadResponse(m.workspace.id, params.uploadId);
}
