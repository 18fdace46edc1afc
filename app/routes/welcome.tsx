import { data, Form, redirect } from "react-router";
import type { Route } from "./+types/welcome";
import { AuthFrame } from "~/components/auth-frame";
import { Button, TextField } from "~/components/ui/form";
import { fieldErrors, formObject, workspaceSchema } from "~/lib/forms";
import { useFormCheck } from "~/lib/use-form-check";
import { requireUser, workspacesOf } from "~/auth/guard.server";
import { createWorkspace } from "~/workspace/workspace.server";
import { Button as KitButton } from "~/components/ui/button";

export const meta: Route.MetaFunction = () => [{ title: "Welcome · Chainproof" }];

export async function loader({ request }: Route.LoaderArgs) {
  const { user } = await requireUser(request);
  return { name: user.name, workspaces: await workspacesOf(user.id) };
}

export async function action({ request }: Route.ActionArgs) {
  const { user } = await requireUser(request);
  const parsed = workspaceSchema.safeParse(formObject(await request.formData()));
  if (!parsed.success) return data({ fields: fieldErrors(parsed.error) }, { status: 400 });
  const ws = await createWorkspace(parsed.data.name, user.id);
  return redirect(`/w/${ws.slug}`);
}

export default function Welcome({ loaderData, actionData }: Route.ComponentProps) {
  const { errors, onSubmit } = useFormCheck(workspaceSchema, actionData?.fields);
  return (
    <AuthFrame title={`Welcome, ${loaderData.name}`}>
      <p className="text-sm text-ink-700">
        A workspace holds your team's vehicles, designs, reviews and bench tests. Create one for your team, or open the invitation link a
        colleague sent you to join theirs.
      </p>
      <Form method="post" className="mt-5 space-y-4" onSubmit={onSubmit} noValidate>
        <TextField label="Workspace name" name="name" placeholder="e.g. Harbourside Carts" required error={errors.name} />
        <Button type="submit" className="w-full">
          Create workspace
        </Button>
      </Form>
      <Form method="post" action="/sign-out" className="mt-4">
        <KitButton type="submit" variant="link" size="inline">
          Sign out
        </KitButton>
      </Form>
    </AuthFrame>
  );
}
