// Reviews of saved revisions: requests, comments, decisions, and the review status everyone shows.
// Every query is scoped by workspace id. Rules: only reviewers decide (the routes ask requireCan
// for "review.decide", and decide() asks can() again), nobody decides on a revision they authored, a decision signs the revision's
// content hash, and a new revision starts without any approval (decisions belong to one revision).
import { and, asc, desc, eq, inArray, isNull, lt } from "drizzle-orm";
import { db, schema } from "~/db/client.server";
import { can, rolesThatCan } from "~/lib/roles";
import { recordAudit } from "~/audit/audit.server";
import { composeMail, sendMail } from "~/mail/mailer.server";
import { env } from "~/env.server";
import { decodeRow, type CompiledDesign, type RowStates } from "~/engine";
import type { Membership } from "~/auth/guard.server";
import { reviewStatus, VERDICT_LABELS, type ReviewStatus, type ReviewVerdict } from "./status";
import { reviewPath } from "./paths";
import { openFaultsMessage, openFaultsOf } from "./dispositions.server";

const { reviewRequest, reviewComment, reviewDecision, designRevision, design, member, user, workspace } = schema;

// ---------------------------------------------------------------- revisions and approval

export type RevisionRecordWithDesign = {
  id: string;
  designId: string;
  designName: string;
  vehicleId: string | null;
  number: number;
  contentHash: string;
  authorId: string;
  createdAt: Date;
};

async function revisionById(workspaceId: string, revisionId: string): Promise<RevisionRecordWithDesign | null> {
  const rows = await db
    .select({
      id: designRevision.id,
      designId: designRevision.designId,
      designName: design.name,
      vehicleId: design.vehicleId,
      number: designRevision.number,
      contentHash: designRevision.contentHash,
      authorId: designRevision.authorId,
      createdAt: designRevision.createdAt,
    })
    .from(designRevision)
    .innerJoin(design, and(eq(design.id, designRevision.designId), eq(design.workspaceId, designRevision.workspaceId)))
    .where(and(eq(designRevision.id, revisionId), eq(designRevision.workspaceId, workspaceId)))
    .limit(1);
  return rows[0] ?? null;
}

export type Approval = {
  reviewerId: string;
  reviewerName: string;
  reviewerEmail: string;
  decidedAt: Date;
  contentHash: string;
  comment: string;
};

/** Decisions on a revision, oldest first, with the reviewer's name. */
async function decisionsOf(workspaceId: string, revisionIds: string[]) {
  if (revisionIds.length === 0) return [];
  return db
    .select({
      id: reviewDecision.id,
      revisionId: reviewDecision.revisionId,
      reviewerId: reviewDecision.reviewerId,
      reviewerName: user.name,
      reviewerEmail: user.email,
      verdict: reviewDecision.verdict,
      comment: reviewDecision.comment,
      contentHash: reviewDecision.contentHash,
      decidedAt: reviewDecision.decidedAt,
    })
    .from(reviewDecision)
    .innerJoin(user, eq(user.id, reviewDecision.reviewerId))
    .where(and(eq(reviewDecision.workspaceId, workspaceId), inArray(reviewDecision.revisionId, revisionIds)))
    .orderBy(asc(reviewDecision.decidedAt));
}

async function requestCounts(workspaceId: string, revisionIds: string[]): Promise<Map<string, number>> {
  const out = new Map<string, number>();
  if (revisionIds.length === 0) return out;
  const rows = await db
    .select({ revisionId: reviewRequest.revisionId })
    .from(reviewRequest)
    .where(and(eq(reviewRequest.workspaceId, workspaceId), inArray(reviewRequest.revisionId, revisionIds)));
  for (const r of rows) out.set(r.revisionId, (out.get(r.revisionId) ?? 0) + 1);
  return out;
}

/** The approvals that count (each reviewer's latest decision, when it approves this content hash). */
function countingApprovals(contentHash: string, decisions: Awaited<ReturnType<typeof decisionsOf>>): Approval[] {
  const latest = new Map<string, (typeof decisions)[number]>();
  for (const d of decisions) if (d.contentHash === contentHash) latest.set(d.reviewerId, d);
  return [...latest.values()]
    .filter((d) => d.verdict === "approved")
    .map((d) => ({
      reviewerId: d.reviewerId,
      reviewerName: d.reviewerName,
      reviewerEmail: d.reviewerEmail,
      decidedAt: d.decidedAt,
      contentHash: d.contentHash,
      comment: d.comment,
    }));
}

export type ApprovedRevision = RevisionRecordWithDesign & { status: "approved"; approvals: Approval[] };

/**
 * The revision when its review status is "approved" (for releases and bench tests), else null.
 * Null too when the revision does not exist in this workspace.
 */
export async function getApprovedRevision(workspaceId: string, revisionId: string): Promise<ApprovedRevision | null> {
  const rev = await revisionById(workspaceId, revisionId);
  if (!rev) return null;
  const [decisions, counts] = await Promise.all([decisionsOf(workspaceId, [rev.id]), requestCounts(workspaceId, [rev.id])]);
  if (reviewStatus(rev.contentHash, counts.get(rev.id) ?? 0, decisions) !== "approved") return null;
  return { ...rev, status: "approved", approvals: countingApprovals(rev.contentHash, decisions) };
}

export async function isRevisionApproved(workspaceId: string, revisionId: string): Promise<boolean> {
  return (await getApprovedRevision(workspaceId, revisionId)) !== null;
}

// ---------------------------------------------------------------- status everywhere

export type RevisionReviewState = { revisionId: string; number: number; status: ReviewStatus };
export type DesignReviewState = {
  /** The latest revision's review status (null when the design has no revision). */
  latest: RevisionReviewState | null;
  /** The newest approved revision, which may be older than the latest. */
  lastApproved: RevisionReviewState | null;
  byNumber: Map<number, RevisionReviewState>;
};

/**
 * Review status of every revision of the given designs (all designs of the workspace when omitted),
 * for lists and overviews: `reviewStatusOf(ws, [id]).get(id)?.latest?.status`.
 */
export async function reviewStatusOf(workspaceId: string, designIds?: string[]): Promise<Map<string, DesignReviewState>> {
  const out = new Map<string, DesignReviewState>();
  if (designIds && designIds.length === 0) return out;
  const revisions = await db
    .select({
      id: designRevision.id,
      designId: designRevision.designId,
      number: designRevision.number,
      contentHash: designRevision.contentHash,
    })
    .from(designRevision)
    .where(and(eq(designRevision.workspaceId, workspaceId), designIds ? inArray(designRevision.designId, designIds) : undefined))
    .orderBy(asc(designRevision.designId), asc(designRevision.number));
  const ids = revisions.map((r) => r.id);
  const [decisions, counts] = await Promise.all([decisionsOf(workspaceId, ids), requestCounts(workspaceId, ids)]);
  const decisionsByRevision = new Map<string, typeof decisions>();
  for (const d of decisions) decisionsByRevision.set(d.revisionId, [...(decisionsByRevision.get(d.revisionId) ?? []), d]);
  for (const r of revisions) {
    const state: RevisionReviewState = {
      revisionId: r.id,
      number: r.number,
      status: reviewStatus(r.contentHash, counts.get(r.id) ?? 0, decisionsByRevision.get(r.id) ?? []),
    };
    let entry = out.get(r.designId);
    if (!entry) out.set(r.designId, (entry = { latest: null, lastApproved: null, byNumber: new Map() }));
    entry.byNumber.set(r.number, state);
    entry.latest = state; // ordered by number
    if (state.status === "approved") entry.lastApproved = state;
  }
  return out;
}

/** The newest approved revision of the design numbered below `number` (what a review compares with). */
export async function lastApprovedBefore(
  workspaceId: string,
  designId: string,
  number: number,
): Promise<{ id: string; number: number } | null> {
  const earlier = await db
    .select({ id: designRevision.id, number: designRevision.number, contentHash: designRevision.contentHash })
    .from(designRevision)
    .where(and(eq(designRevision.workspaceId, workspaceId), eq(designRevision.designId, designId), lt(designRevision.number, number)))
    .orderBy(desc(designRevision.number));
  if (earlier.length === 0) return null;
  const ids = earlier.map((r) => r.id);
  const [decisions, counts] = await Promise.all([decisionsOf(workspaceId, ids), requestCounts(workspaceId, ids)]);
  for (const r of earlier) {
    const mine = decisions.filter((d) => d.revisionId === r.id);
    if (reviewStatus(r.contentHash, counts.get(r.id) ?? 0, mine) === "approved") return { id: r.id, number: r.number };
  }
  return null;
}

// ---------------------------------------------------------------- reviewers

export async function listReviewers(workspaceId: string) {
  return db
    .select({ id: user.id, name: user.name, email: user.email })
    .from(member)
    .innerJoin(user, eq(user.id, member.userId))
    .where(and(eq(member.workspaceId, workspaceId), inArray(member.role, [...rolesThatCan("review.decide")])))
    .orderBy(asc(user.name));
}

// ---------------------------------------------------------------- one revision's review

export async function getReview(workspaceId: string, revisionId: string) {
  const rev = await revisionById(workspaceId, revisionId);
  if (!rev) return null;
  const requester = schema.user;
  const [requests, comments, decisions] = await Promise.all([
    db
      .select({
        id: reviewRequest.id,
        reviewerId: reviewRequest.reviewerId,
        reviewerName: user.name,
        reviewerEmail: user.email,
        requestedBy: reviewRequest.requestedBy,
        note: reviewRequest.note,
        requestedAt: reviewRequest.requestedAt,
      })
      .from(reviewRequest)
      .innerJoin(user, eq(user.id, reviewRequest.reviewerId))
      .where(and(eq(reviewRequest.workspaceId, workspaceId), eq(reviewRequest.revisionId, rev.id)))
      .orderBy(asc(reviewRequest.requestedAt)),
    db
      .select({
        id: reviewComment.id,
        authorId: reviewComment.authorId,
        authorName: requester.name,
        anchor: reviewComment.anchor,
        rowIndex: reviewComment.rowIndex,
        rowStates: reviewComment.rowStates,
        componentId: reviewComment.componentId,
        body: reviewComment.body,
        createdAt: reviewComment.createdAt,
      })
      .from(reviewComment)
      .innerJoin(requester, eq(requester.id, reviewComment.authorId))
      .where(and(eq(reviewComment.workspaceId, workspaceId), eq(reviewComment.revisionId, rev.id)))
      .orderBy(asc(reviewComment.createdAt)),
    decisionsOf(workspaceId, [rev.id]),
  ]);
  return {
    revision: rev,
    requests,
    comments,
    decisions,
    approvals: countingApprovals(rev.contentHash, decisions),
    status: reviewStatus(rev.contentHash, requests.length, decisions),
  };
}

// ---------------------------------------------------------------- acting

export type ActOutcome = { ok: true } | { ok: false; status: 400 | 403 | 404 | 409; fields: Record<string, string> };

const absolute = (path: string) => new URL(path, env.APP_URL).toString();

async function mailQuietly(mails: ReturnType<typeof composeMail>[]) {
  // The decision is saved either way; a mail relay that is down must not undo it.
  await Promise.all(mails.map((m) => sendMail(m).catch((e) => console.error("review mail:", e))));
}

/** An engineer asks reviewers (workspace members with the reviewer role) to review a revision. */
export async function requestReview(
  m: Membership,
  revisionId: string,
  input: { reviewerIds: string[]; note: string },
): Promise<ActOutcome> {
  const rev = await revisionById(m.workspace.id, revisionId);
  if (!rev) return { ok: false, status: 404, fields: { form: "No such revision." } };
  const reviewers = await listReviewers(m.workspace.id);
  const chosen = reviewers.filter((r) => input.reviewerIds.includes(r.id));
  if (chosen.length !== new Set(input.reviewerIds).size) {
    return { ok: false, status: 400, fields: { reviewers: "Choose reviewers from this workspace's members with the reviewer role." } };
  }
  if (chosen.some((r) => r.id === rev.authorId)) {
    return { ok: false, status: 400, fields: { reviewers: "The author of a revision cannot review it; choose someone else." } };
  }
  const now = new Date();
  await db.transaction(async (tx) => {
    for (const r of chosen) {
      await tx
        .insert(reviewRequest)
        .values({
          id: crypto.randomUUID(),
          workspaceId: m.workspace.id,
          designId: rev.designId,
          revisionId: rev.id,
          reviewerId: r.id,
          requestedBy: m.user.id,
          note: input.note,
          requestedAt: now,
        })
        .onConflictDoUpdate({
          target: [reviewRequest.revisionId, reviewRequest.reviewerId],
          set: { requestedBy: m.user.id, note: input.note, requestedAt: now },
        });
    }
    await recordAudit(
      {
        workspaceId: m.workspace.id,
        actorId: m.user.id,
        action: "review.requested",
        subject: `${rev.designName} revision ${rev.number}`,
        detail: { designId: rev.designId, revisionId: rev.id, number: rev.number, reviewers: chosen.map((r) => r.email) },
      },
      tx,
    );
  });
  const link = absolute(reviewPath(m.workspace.slug, rev.designId, rev.number));
  await mailQuietly(
    chosen.map((r) =>
      composeMail(
        r.email,
        `Review requested: ${rev.designName}, revision ${rev.number}`,
        [
          `${m.user.name} asks you to review revision ${rev.number} of “${rev.designName}” in ${m.workspace.name}.`,
          ...(input.note ? [`Their note: ${input.note}`] : []),
          "Check the verdict, the changes since the last approved revision and the truth table, then approve it or request changes.",
        ],
        { label: "Open the review", url: link },
      ),
    ),
  );
  return { ok: true };
}

export type CommentInput =
  | { anchor: "revision"; body: string }
  | { anchor: "row"; row: number; body: string }
  | { anchor: "component"; component: string; body: string };

/** Any member comments on a revision, on one truth-table row (index and states) or on a component. */
export async function addComment(m: Membership, revisionId: string, compiled: CompiledDesign, input: CommentInput): Promise<ActOutcome> {
  const rev = await revisionById(m.workspace.id, revisionId);
  if (!rev) return { ok: false, status: 404, fields: { form: "No such revision." } };
  let rowIndex: number | null = null;
  let rowStates: RowStates | null = null;
  let componentId: string | null = null;
  if (input.anchor === "row") {
    const c = compiled;
    if (input.row >= c.rows) return { ok: false, status: 400, fields: { row: `Choose a row from 0 to ${c.rows - 1}.` } };
    rowIndex = input.row;
    rowStates = { ...decodeRow(c, input.row) }; // a plain object: the engine returns a prototype-less map
  } else if (input.anchor === "component") {
    if (!compiled.design.components.some((x) => x.id === input.component)) {
      return { ok: false, status: 400, fields: { component: `This revision has no component ${JSON.stringify(input.component)}.` } };
    }
    componentId = input.component;
  }
  await db.transaction(async (tx) => {
    const id = crypto.randomUUID();
    await tx.insert(reviewComment).values({
      id,
      workspaceId: m.workspace.id,
      revisionId: rev.id,
      authorId: m.user.id,
      anchor: input.anchor,
      rowIndex,
      rowStates,
      componentId,
      body: input.body,
    });
    await recordAudit(
      {
        workspaceId: m.workspace.id,
        actorId: m.user.id,
        action: "review.commented",
        subject: `${rev.designName} revision ${rev.number}`,
        detail: { designId: rev.designId, revisionId: rev.id, commentId: id, anchor: input.anchor, row: rowIndex, component: componentId },
      },
      tx,
    );
  });
  return { ok: true };
}

/**
 * A reviewer approves or requests changes. The caller has checked the reviewer role; here: not on a
 * revision one authored. The decision records the content hash; the author is told by mail.
 */
export async function decide(m: Membership, revisionId: string, input: { verdict: ReviewVerdict; comment: string }): Promise<ActOutcome> {
  const rev = await revisionById(m.workspace.id, revisionId);
  if (!rev) return { ok: false, status: 404, fields: { form: "No such revision." } };
  if (!can(m.role, "review.decide")) return { ok: false, status: 403, fields: { form: "Only reviewers decide on a revision." } };
  if (rev.authorId === m.user.id) {
    return { ok: false, status: 403, fields: { form: "You authored this revision; another reviewer must decide on it." } };
  }
  if (input.verdict === "approved") {
    // Every single fault that defeats a rule needs a disposition first (decision 161).
    const open = await openFaultsOf(m.workspace.id, rev.id);
    if (open.length > 0) return { ok: false, status: 409, fields: { form: openFaultsMessage(open) } };
  }
  await db.transaction(async (tx) => {
    await tx.insert(reviewDecision).values({
      id: crypto.randomUUID(),
      workspaceId: m.workspace.id,
      designId: rev.designId,
      revisionId: rev.id,
      reviewerId: m.user.id,
      verdict: input.verdict,
      comment: input.comment,
      contentHash: rev.contentHash,
    });
    await recordAudit(
      {
        workspaceId: m.workspace.id,
        actorId: m.user.id,
        action: input.verdict === "approved" ? "review.approved" : "review.changes-requested",
        subject: `${rev.designName} revision ${rev.number}`,
        detail: { designId: rev.designId, revisionId: rev.id, number: rev.number, contentHash: rev.contentHash },
      },
      tx,
    );
  });
  const author = await db.select({ email: user.email, name: user.name }).from(user).where(eq(user.id, rev.authorId)).limit(1);
  if (author[0]) {
    await mailQuietly([
      composeMail(
        author[0].email,
        `${VERDICT_LABELS[input.verdict]}: ${rev.designName}, revision ${rev.number}`,
        [
          input.verdict === "approved"
            ? `${m.user.name} approved revision ${rev.number} of “${rev.designName}” (content hash ${rev.contentHash.slice(0, 12)}).`
            : `${m.user.name} requested changes to revision ${rev.number} of “${rev.designName}”. Save a new revision and ask for a review again.`,
          `Their comment: ${input.comment}`,
        ],
        { label: "Open the review", url: absolute(reviewPath(m.workspace.slug, rev.designId, rev.number)) },
      ),
    ]);
  }
  return { ok: true };
}

// ---------------------------------------------------------------- the inbox

/** Review requests of the workspace, newest first, with each revision's status; `mine` limits to one reviewer. */
export async function reviewInbox(workspaceId: string, reviewerId?: string) {
  const requester = schema.user;
  const rows = await db
    .select({
      requestId: reviewRequest.id,
      revisionId: reviewRequest.revisionId,
      designId: reviewRequest.designId,
      designName: design.name,
      number: designRevision.number,
      contentHash: designRevision.contentHash,
      reviewerId: reviewRequest.reviewerId,
      note: reviewRequest.note,
      requestedAt: reviewRequest.requestedAt,
      requestedBy: reviewRequest.requestedBy,
    })
    .from(reviewRequest)
    .innerJoin(
      designRevision,
      and(eq(designRevision.id, reviewRequest.revisionId), eq(designRevision.workspaceId, reviewRequest.workspaceId)),
    )
    .innerJoin(design, and(eq(design.id, reviewRequest.designId), eq(design.workspaceId, reviewRequest.workspaceId)))
    .innerJoin(workspace, eq(workspace.id, reviewRequest.workspaceId))
    .where(and(eq(reviewRequest.workspaceId, workspaceId), reviewerId ? eq(reviewRequest.reviewerId, reviewerId) : undefined))
    .orderBy(desc(reviewRequest.requestedAt))
    .limit(200);
  const userIds = [...new Set(rows.flatMap((r) => [r.reviewerId, r.requestedBy]))];
  const names = new Map(
    userIds.length === 0
      ? []
      : (await db.select({ id: requester.id, name: requester.name }).from(requester).where(inArray(requester.id, userIds))).map((u) => [
          u.id,
          u.name,
        ]),
  );
  const revisionIds = [...new Set(rows.map((r) => r.revisionId))];
  const [decisions, counts] = await Promise.all([decisionsOf(workspaceId, revisionIds), requestCounts(workspaceId, revisionIds)]);
  return rows.map((r) => {
    const mine = decisions.filter((d) => d.revisionId === r.revisionId);
    const own = mine.filter((d) => d.reviewerId === r.reviewerId).at(-1);
    return {
      ...r,
      reviewerName: names.get(r.reviewerId) ?? "",
      requestedByName: names.get(r.requestedBy) ?? "",
      status: reviewStatus(r.contentHash, counts.get(r.revisionId) ?? 0, mine),
      reviewerDecision: own ? { verdict: own.verdict, decidedAt: own.decidedAt } : null,
    };
  });
}

// ---------------------------------------------------------------- the author's home page

/**
 * The latest revisions of designs whose review asks for changes, saved by `authorId`, with the
 * reviewers' words: what the engineer's home page lists until a new revision is saved.
 */
export async function changeRequestsFor(workspaceId: string, authorId: string) {
  const states = await reviewStatusOf(workspaceId);
  const wanted = [...states.values()].flatMap((s) => (s.latest?.status === "changes-requested" ? [s.latest.revisionId] : []));
  if (wanted.length === 0) return [];
  const revisions = await db
    .select({
      revisionId: designRevision.id,
      designId: design.id,
      designName: design.name,
      number: designRevision.number,
      contentHash: designRevision.contentHash,
    })
    .from(designRevision)
    .innerJoin(design, and(eq(design.id, designRevision.designId), eq(design.workspaceId, designRevision.workspaceId)))
    // An archived design asks nothing more of its author (decision 167).
    .where(
      and(
        eq(designRevision.workspaceId, workspaceId),
        eq(designRevision.authorId, authorId),
        inArray(designRevision.id, wanted),
        isNull(design.archivedAt),
      ),
    )
    .orderBy(asc(design.name));
  const decisions = await decisionsOf(
    workspaceId,
    revisions.map((r) => r.revisionId),
  );
  return revisions.map((r) => {
    const asks = decisions.filter(
      (d) => d.revisionId === r.revisionId && d.verdict === "changes-requested" && d.contentHash === r.contentHash,
    );
    const last = asks.at(-1);
    return { ...r, reviewerName: last?.reviewerName ?? "", comment: last?.comment ?? "", decidedAt: last?.decidedAt ?? null };
  });
}
