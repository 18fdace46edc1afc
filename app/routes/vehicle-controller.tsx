// A vehicle's controller settings record: what the technician entered (every version kept, with who and
// when), its derived values and findings, whether the released proof holds for it, the form to record a
// new version, and two versions compared.
import { data, Form, Link, redirect, useNavigation } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/vehicle-controller";
import { requireCan } from "~/auth/context.server";
import { can } from "~/lib/roles";
import { formObject, type FieldErrors } from "~/lib/forms";
import { compareRecords, formToRecord, parseRecord, recordToForm } from "~/controller-record";
import { getVehicle } from "~/vehicles/vehicles.server";
import { recordHistory, recordVersion, saveRecord, vehicleControllerStatus } from "~/vehicles/controller-records.server";
import { differenceInWords, proofDoesNotHold } from "~/vehicles/controller-status";
import { PageHeader } from "~/components/page-header";
import { SafetyNote } from "~/components/safety-note";
import { Notice } from "~/components/ui/form";
import { When } from "~/designs/design-bits";
import { ProofMark } from "~/components/controller-record/proof-mark";
import { RecordCaution } from "~/components/controller-record/record-caution";
import { RecordFormFields } from "~/components/controller-record/record-form";
import { DerivedValuesTable, FindingList } from "~/components/controller-record/record-status";
import { cardVariants } from "~/components/ui/card";
import { Button } from "~/components/ui/button";
import { Table, TBody, Td, Th, THead } from "~/components/ui/table";

const compareQuery = z.object({
  from: z.coerce.number().int().min(1).optional(),
  to: z.coerce.number().int().min(1).optional(),
  saved: z.coerce.number().int().min(1).optional(),
});

export async function loader({ request, params, context }: Route.LoaderArgs) {
  const m = requireCan(context, "workspace.view");
  const v = await getVehicle(m.workspace.id, params.vehicleId);
  if (!v) throw new Response("Not found", { status: 404 });
  const [history, { status, latest }] = await Promise.all([
    recordHistory(m.workspace.id, v.id),
    vehicleControllerStatus(m.workspace.id, v.id),
  ]);
  const query = compareQuery.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  const q = query.success ? query.data : {};
  let comparison: { from: number; to: number; changes: ReturnType<typeof compareRecords> } | { error: string } | null = null;
  if (!query.success) comparison = { error: "Choose two versions to compare." };
  else if (q.from !== undefined && q.to !== undefined) {
    const a = history.find((h) => h.version === q.from);
    const b = history.find((h) => h.version === q.to);
    comparison =
      a && b
        ? { from: a.version, to: b.version, changes: compareRecords(a.document, b.document) }
        : { error: "This vehicle has no such version." };
  }
  const parsed = latest ? parseRecord(latest.document) : null;
  return {
    slug: m.workspace.slug,
    vehicle: { id: v.id, name: v.name },
    canRecord: can(m.role, "controller.record"),
    latest: latest ? { version: latest.version, recordedAt: latest.recordedAt.toISOString(), recordedBy: latest.recordedBy.name } : null,
    values: parsed?.ok ? recordToForm(parsed.record) : {},
    status: {
      state: status.state,
      errors: status.errors,
      warnings: status.warnings,
      derived: status.derived,
      mark: proofDoesNotHold(status),
      differences: differenceInWords(status),
    },
    history: history.map((h) => ({ version: h.version, recordedAt: h.recordedAt.toISOString(), recordedBy: h.recordedBy.name })),
    comparison,
    saved: q.saved ?? null,
  };
}

type ActionResult = { fields: FieldErrors; values: Record<string, string> };

const baseVersionSchema = z.coerce.number({ message: "The form lost its version; reload the page." }).int().min(0);

/** A problem's path as the form names its field ("settings.lockouts[1]" -> "settings.lockouts"). */
const fieldOf = (path: string) => path.replace(/\[\d+\]$/, "") || "form";

export async function action({ request, params, context }: Route.ActionArgs) {
  const m = requireCan(context, "controller.record");
  const v = await getVehicle(m.workspace.id, params.vehicleId);
  if (!v) throw new Response("Not found", { status: 404 });
  const form = formObject(await request.formData());
  const base = baseVersionSchema.safeParse(form.baseVersion);
  if (!base.success) return data<ActionResult>({ fields: { form: base.error.issues[0]!.message }, values: form }, { status: 400 });
  // Keys the form does not show (sent through the API) are carried over from the version being changed.
  const previous = base.data > 0 ? await recordVersion(m.workspace.id, v.id, base.data) : null;
  const out = await saveRecord(m.workspace.id, v.id, m.user.id, {
    baseVersion: base.data,
    document: formToRecord(form, previous?.document),
  });
  if (out.ok) return redirect(`/w/${m.workspace.slug}/vehicles/${v.id}/controller?saved=${out.version}`);
  if (out.reason === "not-found") throw new Response("Not found", { status: 404 });
  if (out.reason === "stale") {
    return data<ActionResult>(
      {
        fields: {
          form: `Version ${out.currentVersion} was saved while you were editing version ${base.data}, so nothing was saved. Reload the page to start from version ${out.currentVersion}.`,
        },
        values: form,
      },
      { status: 409 },
    );
  }
  const fields: FieldErrors = {};
  for (const p of out.problems) fields[fieldOf(p.path)] ??= p.message;
  return data<ActionResult>({ fields, values: form }, { status: 400 });
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Controller settings · ${data?.vehicle.name ?? "Vehicle"} · Chainproof` }];

export default function VehicleController({ loaderData, actionData }: Route.ComponentProps) {
  const { slug, vehicle, latest, status, history, comparison } = loaderData;
  const result = actionData as ActionResult | undefined;
  const busy = useNavigation().state === "submitting";
  const vehiclePath = `/w/${slug}/vehicles/${vehicle.id}`;
  return (
    <div className="mx-auto max-w-3xl">
      <p className="mb-2 text-sm">
        <Link to={vehiclePath} className="text-copper-700 underline">
          ← {vehicle.name}
        </Link>
      </p>
      <PageHeader
        title="Controller settings"
        description={
          latest ? `Version ${latest.version}, recorded by ${latest.recordedBy}.` : "No settings have been recorded for this vehicle yet."
        }
      />
      <div className="grid gap-5">
        <RecordCaution />
        {loaderData.saved ? <Notice tone="success">Saved as version {loaderData.saved}.</Notice> : null}
        {result?.fields.form ? <Notice tone="error">{result.fields.form}</Notice> : null}

        <section aria-labelledby="proof-h" className={cardVariants({ padding: "lg" })}>
          <h2 id="proof-h" className="font-semibold">
            The released proof and this record
          </h2>
          <div className="mt-3">
            {status.mark ? (
              <ProofMark differences={status.differences} />
            ) : status.state === "holds" ? (
              <p className="text-sm text-moss-700" data-testid="proof-holds">
                The released revision's assumptions about the controller agree with this record.
              </p>
            ) : status.state === "no-release" ? (
              <p className="text-sm text-ink-600">
                No revision is released to this vehicle, so there is no proof to check this record against.
              </p>
            ) : (
              <p className="text-sm text-ink-600">Nothing to check until the settings are recorded.</p>
            )}
          </div>
          {latest ? (
            <>
              <h3 className="mt-5 text-sm font-semibold">Findings of version {latest.version}</h3>
              <div className="mt-2">
                <FindingList
                  findings={[...status.errors, ...status.warnings]}
                  empty="No findings: the settings fit the pack and the throttle as recorded."
                />
              </div>
            </>
          ) : null}
          {status.derived ? (
            <details className="mt-4">
              <summary className="cursor-pointer text-sm font-semibold">Values worked out from the record</summary>
              <div className="mt-3">
                <DerivedValuesTable derived={status.derived} />
              </div>
            </details>
          ) : null}
        </section>

        {loaderData.canRecord ? (
          <section aria-labelledby="form-h">
            <h2 id="form-h" className="mb-3 font-semibold">
              {latest ? "Record changed settings" : "Record the settings"}
            </h2>
            <RecordFormFields
              // A new version resets the form to what was saved.
              key={latest?.version ?? 0}
              values={result?.values ?? loaderData.values}
              baseVersion={latest?.version ?? 0}
              serverErrors={result?.fields}
              busy={busy}
            />
          </section>
        ) : null}

        <section aria-labelledby="history-h" className={cardVariants({ padding: "lg" })}>
          <h2 id="history-h" className="font-semibold">
            Versions
          </h2>
          {history.length === 0 ? (
            <p className="mt-2 text-sm text-ink-600">None yet.</p>
          ) : (
            <ol className="mt-2 space-y-1 text-sm" data-testid="record-history">
              {history.map((h) => (
                <li key={h.version}>
                  Version {h.version} · {h.recordedBy}, <When iso={h.recordedAt} />
                </li>
              ))}
            </ol>
          )}
          {history.length >= 2 ? (
            <Form method="get" className="mt-4 flex flex-wrap items-end gap-3" aria-label="Compare two versions">
              {(["from", "to"] as const).map((k, i) => (
                <label key={k} className="text-sm">
                  <span className="block font-medium text-ink-700">{k === "from" ? "From version" : "To version"}</span>
                  <select
                    name={k}
                    defaultValue={comparison && "from" in comparison ? comparison[k] : history[1 - i]!.version}
                    className="mt-1 block min-h-10 rounded-md border border-ink-300 bg-white px-3"
                  >
                    {history.map((h) => (
                      <option key={h.version} value={h.version}>
                        {h.version}
                      </option>
                    ))}
                  </select>
                </label>
              ))}
              <Button type="submit" variant="secondary">
                Compare
              </Button>
            </Form>
          ) : null}
          {comparison && "error" in comparison ? <p className="mt-3 text-sm text-brick-700">{comparison.error}</p> : null}
          {comparison && "changes" in comparison ? (
            <div className="mt-4 overflow-x-auto" data-testid="record-comparison">
              <h3 className="text-sm font-semibold">{`From version ${comparison.from} to version ${comparison.to}`}</h3>
              {comparison.changes.length === 0 ? (
                <p className="mt-2 text-sm text-ink-600">No setting differs.</p>
              ) : (
                <Table className="mt-2">
                  <THead>
                    <tr>
                      <Th pad="list">Setting</Th>
                      <Th pad="list">Version {comparison.from}</Th>
                      <Th pad="list">Version {comparison.to}</Th>
                    </tr>
                  </THead>
                  <TBody>
                    {comparison.changes.map((c) => (
                      <tr key={c.path} className="align-top">
                        <Th scope="row" pad="list">
                          {c.label}
                          {c.unit ? <span className="font-normal text-ink-500"> ({c.unit})</span> : null}
                        </Th>
                        <Td pad="list" className="tabular-nums">
                          {c.before}
                        </Td>
                        <Td pad="list" className="tabular-nums">
                          {c.after}
                        </Td>
                      </tr>
                    ))}
                  </TBody>
                </Table>
              )}
            </div>
          ) : null}
        </section>
        <SafetyNote />
      </div>
    </div>
  );
}
