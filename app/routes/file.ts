// Downloads an uploaded file: members of its workspace only; anyone else gets 404.
import type { Route } from "./+types/file";
import { requireMember } from "~/auth/guard.server";
import { CAN } from "~/lib/roles";
import { uploadResponse } from "~/uploads/uploads.server";

export async function loader({ request, params }: Route.LoaderArgs) {
  const m = await requireMember(request, params.ws, CAN.view);
  return uploadResponse(m.workspace.id, params.uploadId);
}
