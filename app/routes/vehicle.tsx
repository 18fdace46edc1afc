import { data, Link } from "react-router";
import type { Route } from "./+types/vehicle";
import { requireMember } from "~/auth/guard.server";
import { CAN } from "~/lib/roles";
import { getVehicle } from "~/vehicles/vehicles.server";
import { listUploads, readCappedFormData, saveUpload, UploadError } from "~/uploads/uploads.server";
import { UploadForm } from "~/components/upload-form";
import { PageHeader } from "~/components/page-header";
import { SafetyNote } from "~/components/safety-note";

export async function loader({ request, params }: Route.LoaderArgs) {
  const m = await requireMember(request, params.ws, CAN.view);
  const v = await getVehicle(m.workspace.id, params.vehicleId);
  if (!v) throw new Response("Not found", { status: 404 });
  const photos = await listUploads(m.workspace.id, "vehicle", v.id);
  return {
    slug: m.workspace.slug,
    canEdit: (CAN.manageVehicles as readonly string[]).includes(m.role),
    vehicle: { id: v.id, name: v.name, serial: v.serial, model: v.model, controllerDescription: v.controllerDescription, notes: v.notes },
    photos: photos.map((p) => ({ id: p.id, filename: p.filename, contentType: p.contentType, size: p.size })),
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const m = await requireMember(request, params.ws, CAN.manageVehicles);
  const v = await getVehicle(m.workspace.id, params.vehicleId);
  if (!v) throw new Response("Not found", { status: 404 });
  try {
    const form = await readCappedFormData(request);
    if (form.get("intent") !== "upload-photo") return data({ fields: { intent: "Unknown action." } as Record<string, string> }, { status: 400 });
    await saveUpload({ workspaceId: m.workspace.id, subjectKind: "vehicle", subjectId: v.id, file: form.get("file"), userId: m.user.id });
    return { fields: {} as Record<string, string> };
  } catch (err) {
    if (err instanceof UploadError) return data({ fields: { [err.field]: err.message } as Record<string, string> }, { status: err.status });
    throw err;
  }
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.vehicle.name ?? "Vehicle"} · Chainproof` }];

export default function Vehicle({ loaderData, actionData }: Route.ComponentProps) {
  const v = loaderData.vehicle;
  return (
    <>
      <p className="mb-2 text-sm">
        <Link to=".." relative="path" className="text-copper-700 underline">All vehicles</Link>
      </p>
      <PageHeader title={v.name} description={[v.model, v.serial].filter(Boolean).join(" · ")} />
      <dl className="grid max-w-2xl gap-4 rounded-lg border border-ink-200 bg-white p-5 sm:grid-cols-2">
        <div>
          <dt className="text-xs font-medium uppercase tracking-wide text-ink-500">Serial or VIN</dt>
          <dd className="mt-1">{v.serial || "—"}</dd>
        </div>
        <div>
          <dt className="text-xs font-medium uppercase tracking-wide text-ink-500">Model</dt>
          <dd className="mt-1">{v.model || "—"}</dd>
        </div>
        <div className="sm:col-span-2">
          <dt className="text-xs font-medium uppercase tracking-wide text-ink-500">Motor controller</dt>
          <dd className="mt-1 whitespace-pre-wrap">{v.controllerDescription || "—"}</dd>
        </div>
        <div className="sm:col-span-2">
          <dt className="text-xs font-medium uppercase tracking-wide text-ink-500">Notes</dt>
          <dd className="mt-1 whitespace-pre-wrap">{v.notes || "—"}</dd>
        </div>
      </dl>
      <section className="mt-6 max-w-2xl rounded-lg border border-ink-200 bg-white p-5">
        <h2 className="font-semibold">Photos and documents</h2>
        {loaderData.photos.length === 0 ? (
          <p className="mt-2 text-sm text-ink-600">None yet.</p>
        ) : (
          <ul className="mt-3 grid grid-cols-2 gap-3 sm:grid-cols-3">
            {loaderData.photos.map((p) => (
              <li key={p.id}>
                <a href={`/w/${loaderData.slug}/files/${p.id}`} className="block rounded-md border border-ink-200 p-1 hover:border-copper-500">
                  {p.contentType.startsWith("image/") ? (
                    <img src={`/w/${loaderData.slug}/files/${p.id}`} alt={p.filename} className="aspect-square w-full rounded object-cover" loading="lazy" />
                  ) : (
                    <span className="flex aspect-square items-center justify-center text-sm text-ink-600">PDF</span>
                  )}
                  <span className="mt-1 block truncate text-xs text-ink-600">{p.filename}</span>
                </a>
              </li>
            ))}
          </ul>
        )}
        {loaderData.canEdit ? (
          <div className="mt-4">
            <UploadForm intent="upload-photo" label="Add a photo or PDF (up to 20 MB)" accept="image/jpeg,image/png,image/webp,application/pdf" error={actionData?.fields.file} />
          </div>
        ) : null}
      </section>
      <SafetyNote className="mt-6 max-w-2xl" />
    </>
  );
}
