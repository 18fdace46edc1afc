import { data, Link } from "react-router";
import type { Route } from "./+types/design";
import { requireCan } from "~/auth/context.server";
import { can } from "~/lib/roles";
import { getDesign, getDraft, getRevision, listRevisions, setArchived, statusOf } from "~/designs/designs.server";
import { archiveFormSchema } from "~/designs/forms";
import { formObject } from "~/lib/forms";
import { releasesOfDesign } from "~/vehicles/vehicles.server";
import { ArchiveControl, ArchivedNotice } from "~/components/design/archive";
import { Badge } from "~/components/ui/badge";
import { Notice } from "~/components/ui/form";
import { standingsFor } from "~/designs/standing.server";
import { RefusedBadge, RefusedNotice } from "~/components/refused-mark";
import { designsPath, editorPath } from "~/designs/paths";
import { HashPrefix, Holds, NotProven, Section, StatusBadge, When } from "~/designs/design-bits";
import { proveOffThread } from "~/proofs/pool.server";
import type { Verdict } from "~/designs/types";
import { PageHeader } from "~/components/page-header";
import { SingleFaultResults } from "~/components/common-cause-note";
import { SafetyNote } from "~/components/safety-note";
import { reviewStatusOf } from "~/reviews/reviews.server";
import { reviewPath, truthTablePath } from "~/reviews/paths";
import { labelsOf } from "~/reviews/revision-view.server";
import { ReviewStatusBadge } from "~/components/truth-table/review-status";
import { ButtonLink } from "~/components/ui/link";
import { Table, TableScroll, TBody, Td, Th, THead } from "~/components/ui/table";
import { cardVariants } from "~/components/ui/card";

export async function loader({ params, context }: Route.LoaderArgs) {
  const m = requireCan(context, "workspace.view");
  const d = await getDesign(m.workspace.id, params.designId);
  if (!d) throw new Response("Not found", { status: 404 });
  const [latest, draft, history, reviews, releases] = await Promise.all([
    getRevision(m.workspace.id, d.id),
    getDraft(m.workspace.id, d.id),
    listRevisions(m.workspace.id, d.id),
    reviewStatusOf(m.workspace.id, [d.id]),
    releasesOfDesign(m.workspace.id, d.id),
  ]);
  const review = reviews.get(d.id);
  const standings = await standingsFor(
    m.workspace.id,
    history.map((h) => h.id),
  );
  const refusedOf = (id: string) => {
    const st = standings.get(id);
    return st && !st.passes ? st.reasons : null;
  };
  // Which rules the draft breaks, when its stored check says some do (small tables only, see decision 031).
  let draftFailing: string[] = [];
  if (draft?.check.state === "checked" && !draft.check.ok) {
    // Over the time limit the page shows the stored check without the rule names.
    const proof = await proveOffThread(draft.document).catch(() => ({ ok: false as const }));
    if (proof.ok) {
      const names = labelsOf(proof.design).rules;
      draftFailing = proof.verdict.rules.filter((r) => !r.holds).map((r) => names[r.id] ?? r.id);
    }
  }
  return {
    // An archived design takes no new drafts or revisions: its page offers no editing (decision 167).
    canEdit: can(m.role, "design.edit") && d.archived === null,
    canArchive: can(m.role, "design.archive"),
    slug: m.workspace.slug,
    design: { id: d.id, name: d.name, vehicleId: d.vehicleId, vehicleName: d.vehicleName, status: statusOf(latest?.number) },
    archived: d.archived ? { at: d.archived.at.toISOString(), byName: d.archived.by.name } : null,
    releases: releases.map((r) => ({ ...r, at: r.at.toISOString() })),
    latest: latest
      ? {
          number: latest.number,
          contentHash: latest.contentHash,
          message: latest.message,
          authorName: latest.authorName,
          createdAt: latest.createdAt.toISOString(),
          verdict: latest.verdict,
          refused: refusedOf(latest.id),
          ruleLabels: labelsOf(latest.document).rules,
          componentLabels: labelsOf(latest.document).components,
        }
      : null,
    draft: draft
      ? {
          version: draft.version,
          baseRevision: draft.baseRevision,
          updatedAt: draft.updatedAt.toISOString(),
          updatedByName: draft.updatedByName,
          check: draft.check,
          changed: !latest || latest.contentHash !== draft.contentHash,
          failing: draftFailing,
        }
      : null,
    history: history.map(({ id, ...h }) => ({
      ...h,
      createdAt: h.createdAt.toISOString(),
      review: review?.byNumber.get(h.number)?.status ?? "not-requested",
      refused: refusedOf(id),
    })),
  };
}

/** Archive the design or bring it back (admins and engineers). */
export async function action({ request, params, context }: Route.ActionArgs) {
  const m = requireCan(context, "design.archive");
  const parsed = archiveFormSchema.safeParse(formObject(await request.formData()));
  if (!parsed.success)
    return data({ fields: { intent: parsed.error.issues[0]?.message ?? "intent is archive or restore." } }, { status: 400 });
  const out = await setArchived(m.workspace.id, params.designId, m.user.id, parsed.data.intent === "archive");
  if (out.kind === "missing") throw new Response("Not found", { status: 404 });
  return { fields: {} as Record<string, string> };
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.design.name ?? "Design"} · Chainproof` }];

export default function DesignOverview({ loaderData, actionData }: Route.ComponentProps) {
  const { canEdit, canArchive, slug, design, archived, releases, latest, draft, history } = loaderData;
  const latestReview = history[0]?.review;
  // A refused archive or bring-back (an intent the page does not offer), named above the page.
  const refusal = actionData && "intent" in actionData.fields ? actionData.fields.intent : null;
  return (
    <>
      <p className="mb-2 text-sm">
        <Link to={designsPath(slug)} className="text-copper-700 underline">
          All designs
        </Link>
      </p>
      <PageHeader
        title={design.name}
        description={
          <span className="inline-flex flex-wrap items-center gap-2">
            <StatusBadge status={design.status} />
            {archived ? <Badge tone="caution">Archived</Badge> : null}
            {latestReview ? <ReviewStatusBadge status={latestReview} number={history[0]?.number} /> : null}
            {design.vehicleId ? (
              <Link to={`/w/${slug}/vehicles/${design.vehicleId}`} className="text-copper-700 underline">
                {design.vehicleName}
              </Link>
            ) : (
              <span>No vehicle</span>
            )}
          </span>
        }
        actions={
          <span className="flex flex-wrap items-center gap-2">
            {canArchive ? (
              <ArchiveControl key={archived ? "archived" : "in-use"} designName={design.name} archived={archived !== null} />
            ) : null}
            <ButtonLink to={editorPath(slug, design.id)} variant={canEdit ? "action" : "secondary"}>
              {canEdit ? "Open the editor" : "View on the canvas"}
            </ButtonLink>
          </span>
        }
      />
      {refusal ? (
        <div className="mb-5">
          <Notice tone="error">{refusal}</Notice>
        </div>
      ) : null}
      {archived ? <ArchivedNotice archived={archived} /> : null}

      <div className="grid grid-cols-1 gap-5 lg:grid-cols-3">
        <div className="min-w-0 space-y-5 lg:col-span-2">
          <Section
            title={latest ? `Latest revision: ${latest.number}` : "No revision yet"}
            aside={latest ? <HashPrefix hash={latest.contentHash} /> : null}
          >
            {latest ? (
              <>
                <p className="text-sm text-ink-600 [overflow-wrap:anywhere]">
                  Saved by {latest.authorName}, <When iso={latest.createdAt} />
                  {latest.message ? <> — “{latest.message}”</> : null}
                </p>
                <p className="mt-2 flex flex-wrap gap-3 text-sm">
                  <Link to={reviewPath(slug, design.id, latest.number)} className="font-semibold text-copper-700 underline">
                    Review
                  </Link>
                  <Link to={truthTablePath(slug, design.id, latest.number)} className="font-semibold text-copper-700 underline">
                    Truth table
                  </Link>
                </p>
                {latest.refused ? <RefusedNotice reasons={latest.refused} className="mt-3" /> : null}
                <VerdictSummary verdict={latest.verdict} ruleLabels={latest.ruleLabels} componentLabels={latest.componentLabels} />
              </>
            ) : (
              <p className="text-sm text-ink-600">
                {archived
                  ? "The design was archived before a revision was saved."
                  : canEdit
                    ? "Save the draft from the editor once every rule holds; it becomes revision 1."
                    : "An engineer saves revision 1 once every rule of the draft holds."}
              </p>
            )}
          </Section>
        </div>

        <div className="min-w-0 space-y-5">
          <Section title="Draft">
            {draft ? (
              <div className="space-y-3 text-sm">
                {draft.changed ? (
                  <NotProven check={draft.check} />
                ) : (
                  <p className="text-ink-700">Same as revision {latest?.number}; nothing unsaved.</p>
                )}
                {draft.changed && draft.failing.length > 0 ? (
                  <ul className="list-inside list-disc text-brick-700" aria-label="Rules the draft breaks">
                    {draft.failing.map((name) => (
                      <li key={name}>{name}</li>
                    ))}
                  </ul>
                ) : null}
                <dl className="grid grid-cols-2 gap-x-3 gap-y-1 text-ink-700">
                  <dt className="text-ink-500">Last saved</dt>
                  <dd>
                    <When iso={draft.updatedAt} />
                  </dd>
                  <dt className="text-ink-500">By</dt>
                  <dd>{draft.updatedByName}</dd>
                  <dt className="text-ink-500">Builds on</dt>
                  <dd>{draft.baseRevision ? `revision ${draft.baseRevision}` : "no revision"}</dd>
                  <dt className="text-ink-500">Version</dt>
                  <dd>{draft.version}</dd>
                </dl>
                <p className="text-ink-600">
                  The draft is the working copy. It is not proven until it is saved as a revision, which happens only when every rule holds.
                </p>
                {canEdit ? (
                  <ButtonLink to={editorPath(slug, design.id)} variant="secondary">
                    Continue the draft
                  </ButtonLink>
                ) : null}
              </div>
            ) : (
              <p className="text-sm text-ink-600">No draft.</p>
            )}
          </Section>
          <Section title="Released to vehicles">
            {releases.length === 0 ? (
              <p className="text-sm text-ink-600">No revision of this design has been released to a vehicle.</p>
            ) : (
              <ul className="space-y-2 text-sm" aria-label="Releases of this design">
                {releases.map((r) => (
                  <li key={r.id} className="[overflow-wrap:anywhere]">
                    <Link to={`/w/${slug}/vehicles/${r.vehicleId}`} className="font-semibold text-copper-700 underline">
                      {r.vehicleName}
                    </Link>
                    : revision {r.number}
                    {r.current ? (
                      <>
                        {" "}
                        · <span className="font-semibold text-moss-700">current</span>
                      </>
                    ) : (
                      <> · replaced since</>
                    )}
                    <span className="block text-ink-600">
                      Released by {r.releasedByName}, <When iso={r.at} />
                    </span>
                  </li>
                ))}
              </ul>
            )}
          </Section>
          <SafetyNote />
        </div>
      </div>

      <div className="mt-5">
        <Section title="Revision history">
          {history.length === 0 ? (
            <p className="text-sm text-ink-600">No revisions yet.</p>
          ) : (
            <TableScroll className="-mx-5">
              <Table>
                <THead>
                  <tr>
                    <Th pad="edge">Revision</Th>
                    <Th>Author</Th>
                    <Th>Saved</Th>
                    <Th>Message</Th>
                    <Th>Hash</Th>
                    <Th>Review</Th>
                    <Th pad="edge">
                      <span className="sr-only">Open</span>
                    </Th>
                  </tr>
                </THead>
                <TBody>
                  {history.map((h) => (
                    <tr key={h.number}>
                      <Td pad="edge" className="font-semibold">
                        {h.number}
                        {h.refused ? <RefusedBadge reasons={h.refused} className="ml-2" /> : null}
                      </Td>
                      <Td>{h.authorName}</Td>
                      <Td className="whitespace-nowrap">
                        <When iso={h.createdAt} />
                      </Td>
                      <Td className="min-w-48 text-ink-700 [overflow-wrap:anywhere]">
                        {h.message || <span className="text-ink-400">—</span>}
                      </Td>
                      <Td>
                        <HashPrefix hash={h.contentHash} />
                      </Td>
                      <Td className="whitespace-nowrap">
                        <Link to={reviewPath(slug, design.id, h.number)} aria-label={`Review of revision ${h.number}`}>
                          <ReviewStatusBadge status={h.review} />
                        </Link>
                      </Td>
                      <Td pad="edge" className="whitespace-nowrap">
                        <Link to={editorPath(slug, design.id, h.number)} className="text-copper-700 underline">
                          View<span className="sr-only"> revision {h.number}</span>
                        </Link>
                      </Td>
                    </tr>
                  ))}
                </TBody>
              </Table>
            </TableScroll>
          )}
        </Section>
      </div>
    </>
  );
}

function VerdictSummary({
  verdict,
  ruleLabels,
  componentLabels,
}: {
  verdict: Verdict;
  ruleLabels: Record<string, string>;
  componentLabels: Record<string, string>;
}) {
  return (
    <div className="mt-4 space-y-4">
      <p className="text-sm text-ink-700">
        {verdict.rows.toLocaleString("en-US")} truth-table rows; the drive is on in {verdict.driveRows.toLocaleString("en-US")}.
      </p>
      {verdict.rules.length === 0 ? (
        <p className="text-sm text-ink-600">This design has no rules yet.</p>
      ) : (
        <ul className={cardVariants({ padding: "none", className: "divide-y divide-ink-100" })} aria-label="Rules">
          {verdict.rules.map((r) => (
            <li key={r.id} className="flex flex-wrap items-center justify-between gap-2 px-3 py-2 text-sm">
              <span>
                <span className="font-medium">{ruleLabels[r.id] ?? r.id}</span> <code className="text-xs text-ink-500">{r.id}</code>
              </span>
              <span className="flex items-center gap-3">
                {"unsafeRows" in r ? (
                  <span className="text-xs text-ink-500">
                    {r.violatingRows} of {r.unsafeRows} unsafe rows drive
                  </span>
                ) : (
                  <span className="text-xs text-ink-500">every sequence</span>
                )}
                <Holds holds={r.holds} />
              </span>
            </li>
          ))}
        </ul>
      )}
      <SingleFaultResults>
        <h3 className="text-sm font-semibold">Single contact faults</h3>
        {verdict.singleFaults.length === 0 ? (
          <p className="mt-1 text-sm text-moss-700">No single stuck contact defeats a rule.</p>
        ) : (
          <ul className="mt-1 space-y-1 text-sm" aria-label="Single faults">
            {verdict.singleFaults.map((f) => (
              <li key={`${f.component}-${f.mode}`}>
                <span className="font-medium">{componentLabels[f.component] ?? f.component}</span>{" "}
                <code className="text-xs text-ink-500">{f.component}</code> {f.mode === "stuck-closed" ? "stuck closed" : "stuck open"}{" "}
                defeats {f.defeats.map((id) => ruleLabels[id] ?? id).join(", ")}
              </li>
            ))}
          </ul>
        )}
      </SingleFaultResults>
    </div>
  );
}
