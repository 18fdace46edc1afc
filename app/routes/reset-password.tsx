import { data, Form, redirect } from "react-router";
import type { Route } from "./+types/reset-password";
import { AuthFrame } from "~/components/auth-frame";
import { Button, Notice, TextField } from "~/components/ui/form";
import { fieldErrors, formObject, resetSchema } from "~/lib/forms";
import { useFormCheck } from "~/lib/use-form-check";
import { callAuth } from "~/auth/forms.server";

export const meta: Route.MetaFunction = () => [{ title: "Choose a new password · Chainproof" }];

export async function loader({ request }: Route.LoaderArgs) {
  const url = new URL(request.url);
  return { token: url.searchParams.get("token") ?? "", invalid: url.searchParams.get("error") === "INVALID_TOKEN" };
}

export async function action({ request }: Route.ActionArgs) {
  const parsed = resetSchema.safeParse(formObject(await request.formData()));
  if (!parsed.success) return data({ fields: fieldErrors(parsed.error), message: null }, { status: 400 });
  const response = await callAuth(request, "/reset-password", { token: parsed.data.token, newPassword: parsed.data.password });
  if (!response.ok) return data({ fields: {}, message: "This reset link is no longer valid. Ask for a new one." }, { status: 400 });
  return redirect("/sign-in?reset=1");
}

export default function ResetPassword({ loaderData, actionData }: Route.ComponentProps) {
  const { errors, onSubmit } = useFormCheck(resetSchema, actionData?.fields);
  if (loaderData.invalid || !loaderData.token) {
    return (
      <AuthFrame title="Link expired">
        <Notice tone="error">This reset link is no longer valid. Ask for a new one from the sign-in page.</Notice>
      </AuthFrame>
    );
  }
  return (
    <AuthFrame title="Choose a new password">
      <Form method="post" className="space-y-4" onSubmit={onSubmit} noValidate>
        {actionData?.message ? <Notice tone="error">{actionData.message}</Notice> : null}
        {errors.token ? <Notice tone="error">{errors.token}</Notice> : null}
        <input type="hidden" name="token" value={loaderData.token} />
        <TextField
          label="New password"
          name="password"
          type="password"
          autoComplete="new-password"
          hint="At least 10 characters."
          required
          error={errors.password}
        />
        <Button type="submit" className="w-full">
          Save the new password
        </Button>
      </Form>
    </AuthFrame>
  );
}
