import { data, Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/vehicles";
import { requireCan } from "~/auth/context.server";
import { can } from "~/lib/roles";
import { fieldErrors, formObject, vehicleSchema } from "~/lib/forms";
import { useFormCheck } from "~/lib/use-form-check";
import { createVehicle, listVehicles } from "~/vehicles/vehicles.server";
import { fleetControllerStatus } from "~/vehicles/controller-records.server";
import { differenceInWords, proofDoesNotHold, PROOF_DOES_NOT_HOLD } from "~/vehicles/controller-status";
import { PageHeader } from "~/components/page-header";
import { EmptyState } from "~/components/empty-state";
import { Button, TextArea, TextField } from "~/components/ui/form";
import { cardVariants } from "~/components/ui/card";
import { Badge } from "~/components/ui/badge";

export const meta: Route.MetaFunction = () => [{ title: "Vehicles · Chainproof" }];

export async function loader({ context }: Route.LoaderArgs) {
  const m = requireCan(context, "workspace.view");
  const [vehicles, controller] = await Promise.all([listVehicles(m.workspace.id), fleetControllerStatus(m.workspace.id)]);
  return {
    canAdd: can(m.role, "vehicle.manage"),
    vehicles: vehicles.map((v) => ({
      id: v.id,
      name: v.name,
      serial: v.serial,
      model: v.model,
      needsAttention: v.needsAttention,
      release: v.release ? { designName: v.release.designName, number: v.release.number } : null,
      controllerDifferences: (() => {
        const c = controller.get(v.id);
        return c && proofDoesNotHold(c.status) ? differenceInWords(c.status) : [];
      })(),
    })),
  };
}

export async function action({ request, context }: Route.ActionArgs) {
  const m = requireCan(context, "vehicle.manage");
  const parsed = vehicleSchema.safeParse(formObject(await request.formData()));
  if (!parsed.success) return data({ fields: fieldErrors(parsed.error), created: null }, { status: 400 });
  const id = await createVehicle(m.workspace.id, m.user.id, parsed.data);
  return { fields: {}, created: id };
}

export default function Vehicles({ loaderData, actionData }: Route.ComponentProps) {
  const { errors, onSubmit } = useFormCheck(vehicleSchema, actionData?.fields);
  const busy = useNavigation().state === "submitting";
  return (
    <>
      <PageHeader
        title="Vehicles"
        description="Each vehicle carries the design revision released to it, its photos and its bench-test records."
      />
      {loaderData.vehicles.length === 0 ? (
        <EmptyState title="No vehicles yet">
          {loaderData.canAdd
            ? "Add the first vehicle below with its name and serial number."
            : "An engineer or technician adds vehicles here."}
        </EmptyState>
      ) : (
        <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
          {loaderData.vehicles.map((v) => (
            <li key={v.id}>
              <Link to={v.id} className={cardVariants({ padding: "md", interactive: true, className: "block min-h-20" })}>
                <span className="block font-semibold">{v.name}</span>
                <span className="block text-sm text-ink-600">
                  {[v.model, v.serial].filter(Boolean).join(" · ") || "No model or serial yet"}
                </span>
                <span className="mt-2 block text-xs text-ink-600">
                  {v.release ? `Released: ${v.release.designName}, revision ${v.release.number}` : "No revision released"}
                </span>
                {v.needsAttention ? (
                  <Badge tone="failing-solid" className="mt-2">
                    Needs attention
                  </Badge>
                ) : null}
                {v.controllerDifferences.length > 0 ? (
                  <span
                    className="mt-2 block rounded-md border-2 border-brick-600 bg-brick-50 p-2 text-xs text-brick-700"
                    data-testid="proof-mark"
                  >
                    <span className="block font-semibold">{PROOF_DOES_NOT_HOLD}.</span>
                    {v.controllerDifferences.map((d) => (
                      <span key={d} className="mt-1 block">
                        {d}
                      </span>
                    ))}
                  </span>
                ) : null}
              </Link>
            </li>
          ))}
        </ul>
      )}
      {loaderData.canAdd ? (
        <section className={cardVariants({ padding: "lg", className: "mt-8 max-w-xl" })}>
          <h2 className="font-semibold">Add a vehicle</h2>
          <Form method="post" className="mt-4 space-y-4" onSubmit={onSubmit} noValidate key={actionData?.created ?? "new"}>
            <TextField label="Name" name="name" required error={errors.name} />
            <div className="grid gap-4 sm:grid-cols-2">
              <TextField label="Serial or VIN" name="serial" error={errors.serial} />
              <TextField label="Model" name="model" error={errors.model} />
            </div>
            <TextArea label="Motor controller (free text)" name="controllerDescription" rows={2} error={errors.controllerDescription} />
            <TextArea label="Notes" name="notes" rows={2} error={errors.notes} />
            <Button type="submit" disabled={busy}>
              {busy ? "Adding…" : "Add vehicle"}
            </Button>
          </Form>
        </section>
      ) : null}
    </>
  );
}
