// Whether a revision carries a reviewer's approval: the one question a release asks. The answer is
// the review work's (approval records, app/reviews); this module only names it for vehicles.
import { isRevisionApproved } from "~/reviews/reviews.server";

export type Approval = "approved" | "not-approved";

export async function revisionApproval(workspaceId: string, revisionId: string): Promise<Approval> {
  return (await isRevisionApproved(workspaceId, revisionId)) ? "approved" : "not-approved";
}
