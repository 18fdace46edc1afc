// Fault dispositions of a revision (docs/decisions/161): recorded by engineers and reviewers for each
// single fault the stored verdict says defeats a rule, tied to the revision's content hash, audited;
// approval waits until every such fault has one. Every query is scoped by workspace id.
import { and, asc, eq } from "drizzle-orm";
import { db, schema } from "~/db/client.server";
import { recordAudit } from "~/audit/audit.server";
import type { Membership } from "~/auth/guard.server";
import type { SingleFault, Verdict } from "~/engine";
import { DISPOSITION_LABELS, faultKey, faultWords, type Disposition, type DispositionInput } from "./dispositions";

const { faultDisposition, designRevision, design, user } = schema;

export type FaultDispositionView = {
  id: string;
  component: string;
  mode: string;
  disposition: Disposition;
  justification: string;
  authorId: string;
  authorName: string;
  contentHash: string;
  createdAt: Date;
};

type RevisionFacts = { id: string; designId: string; designName: string; number: number; contentHash: string; verdict: Verdict };

async function revisionFacts(workspaceId: string, revisionId: string): Promise<RevisionFacts | null> {
  const rows = await db
    .select({
      id: designRevision.id,
      designId: designRevision.designId,
      designName: design.name,
      number: designRevision.number,
      contentHash: designRevision.contentHash,
      verdict: designRevision.verdict,
    })
    .from(designRevision)
    .innerJoin(design, and(eq(design.id, designRevision.designId), eq(design.workspaceId, designRevision.workspaceId)))
    .where(and(eq(designRevision.id, revisionId), eq(designRevision.workspaceId, workspaceId)))
    .limit(1);
  return rows[0] ?? null;
}

/** Every disposition recorded on a revision against its content hash, oldest first (the history). */
export async function dispositionHistory(workspaceId: string, revisionId: string, contentHash: string): Promise<FaultDispositionView[]> {
  return db
    .select({
      id: faultDisposition.id,
      component: faultDisposition.component,
      mode: faultDisposition.mode,
      disposition: faultDisposition.disposition,
      justification: faultDisposition.justification,
      authorId: faultDisposition.authorId,
      authorName: user.name,
      contentHash: faultDisposition.contentHash,
      createdAt: faultDisposition.createdAt,
    })
    .from(faultDisposition)
    .innerJoin(user, eq(user.id, faultDisposition.authorId))
    .where(
      and(
        eq(faultDisposition.workspaceId, workspaceId),
        eq(faultDisposition.revisionId, revisionId),
        eq(faultDisposition.contentHash, contentHash),
      ),
    )
    .orderBy(asc(faultDisposition.createdAt), asc(faultDisposition.id));
}

/** The disposition that counts for each fault: the latest recorded for it. */
export function currentDispositions(history: readonly FaultDispositionView[]): Map<string, FaultDispositionView> {
  const out = new Map<string, FaultDispositionView>();
  for (const d of history) out.set(faultKey(d), d);
  return out;
}

/** The verdict's defeating faults that have no disposition yet, in verdict order. */
export function openFaults(faults: readonly SingleFault[], current: ReadonlyMap<string, unknown>): SingleFault[] {
  return faults.filter((f) => !current.has(faultKey(f)));
}

/** The message that refuses an approval while faults are open. */
export function openFaultsMessage(open: readonly SingleFault[]): string {
  const named = open.map((f) => `${faultWords(f)} (defeats ${f.defeats.join(", ")})`);
  return `Approval refused: ${open.length === 1 ? "this single fault has" : `these ${open.length} single faults have`} no disposition yet: ${named.join("; ")}. Record how each is dealt with under "Single faults", then approve.`;
}

/** Open faults of a stored revision (for the approval check). */
export async function openFaultsOf(workspaceId: string, revisionId: string): Promise<SingleFault[]> {
  const rev = await revisionFacts(workspaceId, revisionId);
  if (!rev) return [];
  const current = currentDispositions(await dispositionHistory(workspaceId, rev.id, rev.contentHash));
  return openFaults(rev.verdict.singleFaults ?? [], current);
}

export type DisposeOutcome = { ok: true } | { ok: false; status: 400 | 404; fields: Record<string, string> };

/** Records a disposition for one of the revision's defeating faults, with an audit event, in one transaction. */
export async function recordDisposition(
  m: Membership,
  revisionId: string,
  input: Omit<DispositionInput, "intent">,
): Promise<DisposeOutcome> {
  const rev = await revisionFacts(m.workspace.id, revisionId);
  if (!rev) return { ok: false, status: 404, fields: { form: "No such revision." } };
  const fault = (rev.verdict.singleFaults ?? []).find((f) => f.component === input.component && f.mode === input.mode);
  if (!fault) {
    return {
      ok: false,
      status: 400,
      fields: { component: `In revision ${rev.number} no single fault ${faultWords(input)} defeats a rule, so it needs no disposition.` },
    };
  }
  await db.transaction(async (tx) => {
    const id = crypto.randomUUID();
    await tx.insert(faultDisposition).values({
      id,
      workspaceId: m.workspace.id,
      designId: rev.designId,
      revisionId: rev.id,
      contentHash: rev.contentHash,
      component: input.component,
      mode: input.mode,
      disposition: input.disposition,
      justification: input.justification,
      authorId: m.user.id,
    });
    await recordAudit(
      {
        workspaceId: m.workspace.id,
        actorId: m.user.id,
        action: "review.fault-disposed",
        subject: `${rev.designName} revision ${rev.number}`,
        detail: {
          designId: rev.designId,
          revisionId: rev.id,
          number: rev.number,
          contentHash: rev.contentHash,
          fault: faultKey(input),
          defeats: fault.defeats,
          disposition: input.disposition,
          dispositionLabel: DISPOSITION_LABELS[input.disposition],
          justification: input.justification,
        },
      },
      tx,
    );
  });
  return { ok: true };
}
