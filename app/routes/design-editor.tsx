import { useCallback, useEffect, useRef } from "react";
import { Link } from "react-router";
import type { Route } from "./+types/design-editor";
import { requireMember } from "~/auth/guard.server";
import { CAN } from "~/lib/roles";
import { editorStart, getDesign, getDraft, getRevision } from "~/designs/designs.server";
import { blankDocument } from "~/designs/templates.server";
import { designPath } from "~/designs/paths";
import type { ApiErrorBody, Problem, SaveDraftResult, SaveRevisionResult, Verdict } from "~/designs/types";
import { DesignEditor } from "~/canvas/design-editor";
import { SafetyNote } from "~/components/safety-note";

export async function loader({ request, params }: Route.LoaderArgs) {
  const m = await requireMember(request, params.ws, CAN.view);
  const d = await getDesign(m.workspace.id, params.designId);
  if (!d) throw new Response("Not found", { status: 404 });
  const canEdit = (CAN.editDesigns as readonly string[]).includes(m.role);
  const draft = await getDraft(m.workspace.id, d.id);
  const search = new URL(request.url).searchParams;
  // ?row=I opens simulating row I of what is shown; the editor checks it against the design.
  const common = { slug: m.workspace.slug, design: { id: d.id, name: d.name }, draftVersion: draft?.version ?? 0, row: search.get("row") };

  // ?revision=N shows that saved revision, read-only.
  const wanted = search.get("revision");
  if (wanted !== null) {
    const number = /^[1-9][0-9]{0,8}$/.test(wanted) ? Number(wanted) : null;
    const rev = number === null ? null : await getRevision(m.workspace.id, d.id, number);
    if (!rev) throw new Response(`This design has no revision ${wanted}.`, { status: 404 });
    return { ...common, readOnly: true, initial: rev.document as unknown, baseRevision: rev.number, showing: { kind: "revision" as const, number: rev.number } };
  }
  const latest = await getRevision(m.workspace.id, d.id);
  const start = editorStart(draft, latest);
  return {
    ...common,
    readOnly: !canEdit,
    initial: (start.source === "none" ? blankDocument(d.name) : start.document) as unknown,
    baseRevision: start.baseRevision,
    showing:
      start.source === "revision"
        ? { kind: "revision" as const, number: start.baseRevision }
        : { kind: "draft" as const, number: start.baseRevision, changed: !latest || latest.contentHash !== draft?.contentHash },
  };
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.design.name ?? "Design"} · Editor · Chainproof` }];

/** The body of an API answer, or null when it is not JSON (a proxy page, a dropped connection). */
async function bodyOf(res: Response): Promise<Record<string, unknown> | null> {
  try {
    return (await res.json()) as Record<string, unknown>;
  } catch {
    return null;
  }
}

/** A sentence for an answer the editor has no special handling for. */
function failure(res: Response, body: Record<string, unknown> | null): Error {
  if (res.status === 401) return new Error("You are signed out. Sign in again in another tab, then save again; your changes are still here.");
  const message = (body as ApiErrorBody | null)?.error?.message;
  return new Error(message ?? `The server answered ${res.status}; nothing was saved. Try again.`);
}

async function call(url: string, method: string, payload: unknown): Promise<{ res: Response; body: Record<string, unknown> | null }> {
  let res: Response;
  try {
    res = await fetch(url, { method, headers: { "content-type": "application/json", accept: "application/json" }, body: JSON.stringify(payload) });
  } catch {
    throw new Error("The server could not be reached; nothing was saved. Check the connection and save again.");
  }
  return { res, body: await bodyOf(res) };
}

export default function DesignEditorPage({ loaderData }: Route.ComponentProps) {
  const { slug, design, readOnly, initial, draftVersion, baseRevision, showing, row } = loaderData;
  // The revision the working copy builds on; a saved revision moves it, and draft saves record it.
  const base = useRef(baseRevision);
  useEffect(() => {
    base.current = baseRevision;
  }, [design.id, baseRevision]);

  const onSaveDraft = useCallback(
    async (doc: unknown, version: number): Promise<SaveDraftResult> => {
      const { res, body } = await call(`/api/v1/designs/${design.id}/draft`, "PUT", { document: doc, version, baseRevision: base.current });
      if (res.status === 200 && typeof body?.version === "number") return { ok: true, version: body.version };
      if (res.status === 409 && typeof body?.currentVersion === "number") return { ok: false, status: 409, currentVersion: body.currentVersion };
      throw failure(res, body);
    },
    [design.id],
  );

  const onSaveRevision = useCallback(
    async (doc: unknown, baseRevision: number, message: string): Promise<SaveRevisionResult> => {
      const { res, body } = await call(`/api/v1/designs/${design.id}/revisions`, "POST", { document: doc, baseRevision, message });
      if (res.status === 201 && body?.revision) {
        const revision = body.revision as { number: number; contentHash: string; verdict: Verdict };
        base.current = revision.number;
        return { status: 201, revision };
      }
      if (res.status === 400 && body?.error) {
        const error = (body as ApiErrorBody).error;
        const problems: Problem[] = error.fields.length > 0 ? error.fields : [{ path: "", message: error.message }];
        return { status: 400, problems };
      }
      if (res.status === 422 && body?.verdict) return { status: 422, verdict: body.verdict as Verdict };
      if (res.status === 409 && typeof body?.latestRevision === "number") return { status: 409, latestRevision: body.latestRevision };
      throw failure(res, body);
    },
    [design.id],
  );

  return (
    <>
      <div className="mb-3 flex flex-wrap items-center justify-between gap-x-4 gap-y-2">
        <div className="min-w-0">
          <p className="text-sm">
            <Link to={designPath(slug, design.id)} className="text-copper-700 underline">
              {design.name}
            </Link>
          </p>
          <h1 className="sr-only">Editor: {design.name}</h1>
        </div>
        {/* What was opened; the canvas itself reports what happens after (draft saved, revision proven). */}
        <p className="text-sm text-ink-700">
          {showing.kind === "revision"
            ? `Opened revision ${showing.number}${readOnly ? ", read-only" : ""}`
            : `Opened the draft${showing.changed ? "" : `, same as revision ${showing.number}`}${readOnly ? ", read-only" : ""}`}
        </p>
      </div>
      <DesignEditor
        key={`${design.id}-${showing.kind}-${showing.number}-${row ?? ""}`}
        initial={initial}
        draftVersion={draftVersion}
        baseRevision={baseRevision}
        readOnly={readOnly}
        designName={design.name}
        row={row}
        initialIsRevision={showing.kind === "revision" || !showing.changed}
        onSaveDraft={onSaveDraft}
        onSaveRevision={onSaveRevision}
      />
      <SafetyNote className="mt-4" />
    </>
  );
}
