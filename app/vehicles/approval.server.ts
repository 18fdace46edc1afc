// Whether a revision carries a reviewer's approval record: the one question a release asks.
// Approvals belong to the review work (app/reviews); until its check exists this answers
// "unavailable", and a release is refused with that reason rather than assumed (decision 070).
export type Approval = "approved" | "not-approved" | "unavailable";

export async function revisionApproval(_workspaceId: string, _revisionId: string): Promise<Approval> {
  return "unavailable";
}
