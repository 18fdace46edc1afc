import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/design-new";
import { requireCan } from "~/auth/context.server";
import { fieldErrors, formObject } from "~/lib/forms";
import { useFormCheck } from "~/lib/use-form-check";
import { createDesign } from "~/designs/designs.server";
import { createDesignSchema, STARTS } from "~/designs/forms";
import { editorPath } from "~/designs/paths";
import { vehicleNames } from "~/vehicles/vehicles.server";
import { PageHeader } from "~/components/page-header";
import { Button, SelectField, TextField } from "~/components/ui/form";
import { cardVariants } from "~/components/ui/card";

export const meta: Route.MetaFunction = () => [{ title: "New design · Chainproof" }];

export async function loader({ request, context }: Route.LoaderArgs) {
  const m = requireCan(context, "design.edit");
  const vehicles = await vehicleNames(m.workspace.id);
  const wanted = new URL(request.url).searchParams.get("vehicle");
  return {
    vehicles,
    vehicleId: vehicles.some((v) => v.id === wanted) ? wanted : "",
  };
}

export async function action({ request, context }: Route.ActionArgs) {
  const m = requireCan(context, "design.edit");
  const parsed = createDesignSchema.safeParse(formObject(await request.formData()));
  if (!parsed.success) return data({ fields: fieldErrors(parsed.error) }, { status: 400 });
  const created = await createDesign(m.workspace.id, m.user.id, parsed.data);
  if (!created.ok) return data({ fields: created.fields }, { status: 400 });
  return redirect(editorPath(m.workspace.slug, created.id));
}

export default function NewDesign({ loaderData, actionData }: Route.ComponentProps) {
  const { errors, onSubmit } = useFormCheck(createDesignSchema, actionData?.fields);
  const busy = useNavigation().state !== "idle";
  return (
    <>
      <p className="mb-2 text-sm">
        <Link to=".." relative="path" className="text-copper-700 underline">
          All designs
        </Link>
      </p>
      <PageHeader
        title="New design"
        description="The design starts as a draft. It becomes revision 1 when you save it and every rule holds."
      />
      <section className={cardVariants({ padding: "lg", className: "max-w-xl" })}>
        <Form method="post" className="space-y-5" onSubmit={onSubmit} noValidate>
          <TextField
            label="Name"
            name="name"
            required
            maxLength={120}
            error={errors.name}
            placeholder="e.g. Hauler #3 rear deck, inhibit wiring"
          />
          <SelectField label="Vehicle" name="vehicleId" defaultValue={loaderData.vehicleId ?? ""} error={errors.vehicleId}>
            <option value="">No vehicle</option>
            {loaderData.vehicles.map((v) => (
              <option key={v.id} value={v.id}>
                {v.name}
              </option>
            ))}
          </SelectField>
          <fieldset>
            <legend className="block text-sm font-medium text-ink-700">Start from</legend>
            <div className="mt-2 space-y-2">
              {STARTS.map((s, i) => (
                <label
                  key={s.key}
                  className="flex min-h-11 cursor-pointer items-start gap-3 rounded-md border border-ink-200 px-3 py-2 has-[:checked]:border-copper-500 has-[:checked]:bg-copper-50"
                >
                  <input type="radio" name="start" value={s.key} defaultChecked={i === 0} className="mt-1 accent-copper-600" />
                  <span>
                    <span className="block text-sm font-semibold">{s.label}</span>
                    <span className="block text-sm text-ink-600">{s.description}</span>
                  </span>
                </label>
              ))}
            </div>
            {errors.start ? (
              <p className="mt-1 text-sm text-brick-700" role="alert">
                {errors.start}
              </p>
            ) : null}
          </fieldset>
          <Button type="submit" disabled={busy}>
            {busy ? "Creating…" : "Create and open the editor"}
          </Button>
        </Form>
      </section>
    </>
  );
}
