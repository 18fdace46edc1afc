import { useCallback, useEffect, useRef } from "react";
import { Link, useParams } from "react-router";
import type { Route } from "./+types/design-editor";
import { requireCan } from "~/auth/context.server";
import { can } from "~/lib/roles";
import { editorStart, getDesign, getDraft, getRevision } from "~/designs/designs.server";
import { blankDocument } from "~/designs/templates.server";
import { designPath } from "~/designs/paths";
import type { SaveDraftResult, SaveRevisionResult } from "~/designs/types";
import type { ErrorAnswer } from "~/api/answers";
import { DesignEditor } from "~/canvas/design-editor";
import { SafetyNote } from "~/components/safety-note";
import { SectionError } from "~/components/error-boundary";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  const m = requireCan(context, "workspace.view");
  const d = await getDesign(m.workspace.id, params.designId);
  if (!d) throw new Response("Not found", { status: 404 });
  const canEdit = can(m.role, "design.edit");
  const draft = await getDraft(m.workspace.id, d.id);
  const search = new URL(request.url).searchParams;
  // ?row=I opens simulating row I of what is shown; the editor checks it against the design.
  const common = {
    slug: m.workspace.slug,
    design: { id: d.id, name: d.name, archived: d.archived !== null },
    draftVersion: draft?.version ?? 0,
    row: search.get("row"),
  };

  // ?revision=N shows that saved revision, read-only.
  const wanted = search.get("revision");
  if (wanted !== null) {
    const number = /^[1-9][0-9]{0,8}$/.test(wanted) ? Number(wanted) : null;
    const rev = number === null ? null : await getRevision(m.workspace.id, d.id, number);
    if (!rev) throw new Response(`This design has no revision ${wanted}.`, { status: 404 });
    return {
      ...common,
      readOnly: true,
      initial: rev.document,
      baseRevision: rev.number,
      showing: { kind: "revision" as const, number: rev.number },
    };
  }
  const latest = await getRevision(m.workspace.id, d.id);
  const start = editorStart(draft, latest);
  return {
    ...common,
    // An archived design is read-only for everyone: no new drafts or revisions (decision 167).
    readOnly: !canEdit || d.archived !== null,
    initial: (start.source === "none" ? blankDocument(d.name) : start.document) as unknown,
    baseRevision: start.baseRevision,
    showing:
      start.source === "revision"
        ? { kind: "revision" as const, number: start.baseRevision }
        : { kind: "draft" as const, number: start.baseRevision, changed: !latest || latest.contentHash !== draft?.contentHash },
  };
}

/** The editor gets the whole window: the shell collapses its navigation to a rail. */
export const handle = { layout: "canvas" };

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.design.name ?? "Design"} · Editor · Chainproof` }];

/** The API client and its endpoint table carry every answer's zod schema: loaded on the first save, not
 *  with the canvas (decision 143). */
const loadApi = () =>
  Promise.all([import("~/api/client"), import("~/api/endpoints")]).then(
    ([client, endpoints]) => ({ ...client, api: endpoints.api }),
    () => {
      throw new Error("The server could not be reached; nothing was saved. Check the connection and save again.");
    },
  );
type ApiModule = Awaited<ReturnType<typeof loadApi>>;

/** A sentence for an answer the editor has no special handling for (the server unreachable, signed out...). */
function failure({ ApiError }: ApiModule, e: unknown): Error {
  if (!(e instanceof ApiError)) return e instanceof Error ? e : new Error(String(e));
  if (e.status === 0) return new Error("The server could not be reached; nothing was saved. Check the connection and save again.");
  if (e.status === 401) return new Error("You are signed out. Sign in again in another tab, then save again; your changes are still here.");
  if (e.code === "unexpected_answer") return new Error(`The server answered ${e.status}; nothing was saved. Try again.`);
  return new Error(e.message);
}

/** An answer of a declared status with no special handling here: the API's message, as an Error. */
function refused(m: ApiModule, a: { status: number; body: ErrorAnswer }): Error {
  return failure(m, new m.ApiError(a.body.error.message, a.status, a.body.error.code, a.body.error.fields));
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
      // The editor hands over what it holds; the server refuses (400) anything but a JSON object.
      const document = doc as Record<string, unknown>;
      const m = await loadApi();
      const a = await m
        .callApi(m.api.saveDraft, { params: { designId: design.id }, body: { document, version, baseRevision: base.current } })
        .catch((e) => {
          throw failure(m, e);
        });
      if (a.status === 200) return { ok: true, version: a.body.version };
      // A 409 is a stale draft, or a design archived since the editor opened (its message says so).
      if (a.status === 409 && "currentVersion" in a.body) return { ok: false, status: 409, currentVersion: a.body.currentVersion };
      throw refused(m, a);
    },
    [design.id],
  );

  const onSaveRevision = useCallback(
    async (doc: unknown, baseRevision: number, message: string): Promise<SaveRevisionResult> => {
      const m = await loadApi();
      const a = await m
        .callApi(m.api.saveRevision, { params: { designId: design.id }, body: { document: doc, baseRevision, message } })
        .catch((e) => {
          throw failure(m, e);
        });
      if (a.status === 201) {
        base.current = a.body.revision.number;
        return { status: 201, revision: a.body.revision };
      }
      if (a.status === 400) {
        const error = a.body.error;
        return { status: 400, problems: error.fields.length > 0 ? error.fields : [{ path: "", message: error.message }] };
      }
      if (a.status === 422) return { status: 422, verdict: a.body.verdict };
      if (a.status === 409 && "latestRevision" in a.body) return { status: 409, latestRevision: a.body.latestRevision };
      throw refused(m, a);
    },
    [design.id],
  );

  return (
    <div className="flex min-w-0 flex-col md:min-h-0 md:flex-1">
      <div className="mb-2 flex flex-wrap items-center justify-between gap-x-4 gap-y-1">
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
          {design.archived ? " (the design is archived)" : ""}
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
      <SafetyNote className="mt-2" />
    </div>
  );
}

/** The editor's own boundary: inside the workspace, with the way back to the design's page. */
export function ErrorBoundary() {
  const { ws, designId } = useParams();
  return (
    <SectionError
      back={
        ws && designId ? (
          <Link to={designPath(ws, designId)} className="font-semibold text-action-ink underline">
            Back to the design
          </Link>
        ) : null
      }
    />
  );
}
