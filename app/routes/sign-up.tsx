import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/sign-up";
import { AuthFrame } from "~/components/auth-frame";
import { Button, Notice, TextField } from "~/components/ui/form";
import { fieldErrors, formObject, signUpSchema, type FieldErrors } from "~/lib/forms";
import { safeNext } from "~/lib/safe-next";
import { useFormCheck } from "~/lib/use-form-check";
import { getSignedIn } from "~/auth/guard.server";
import { authErrorMessage, callAuth } from "~/auth/forms.server";

export const meta: Route.MetaFunction = () => [{ title: "Create an account · Chainproof" }];

export async function loader({ request }: Route.LoaderArgs) {
  const url = new URL(request.url);
  if (await getSignedIn(request)) throw redirect("/");
  return { next: safeNext(url.searchParams.get("next")), email: url.searchParams.get("email") ?? "" };
}

export async function action({ request }: Route.ActionArgs) {
  const form = await request.formData();
  const parsed = signUpSchema.safeParse(formObject(form));
  if (!parsed.success) return data({ fields: fieldErrors(parsed.error), message: null, sentTo: null }, { status: 400 });
  const next = safeNext(String(form.get("next") ?? ""));
  const callbackURL = `/sign-in?verified=1&next=${encodeURIComponent(next)}`;
  const response = await callAuth(request, "/sign-up/email", { ...parsed.data, callbackURL });
  if (!response.ok) {
    const { code, message } = await authErrorMessage(response);
    const fields: FieldErrors = code.includes("USER_ALREADY_EXISTS")
      ? { email: "An account with this e-mail already exists. Sign in instead." }
      : {};
    return data(
      { fields, message: Object.keys(fields).length ? null : message, sentTo: null },
      { status: response.status === 429 ? 429 : 400 },
    );
  }
  return { fields: {}, message: null, sentTo: parsed.data.email };
}

export default function SignUp({ loaderData, actionData }: Route.ComponentProps) {
  const { errors, onSubmit } = useFormCheck(signUpSchema, actionData?.fields);
  const busy = useNavigation().state === "submitting";
  if (actionData?.sentTo) {
    return (
      <AuthFrame title="Check your mail">
        <p className="text-sm text-ink-700">
          We sent a confirmation link to <strong>{actionData.sentTo}</strong>. Open it to finish creating your account, then sign in.
        </p>
      </AuthFrame>
    );
  }
  return (
    <AuthFrame
      title="Create an account"
      footer={
        <>
          Already have one?{" "}
          <Link className="font-semibold text-copper-700 underline" to="/sign-in">
            Sign in
          </Link>
        </>
      }
    >
      <Form method="post" className="space-y-4" onSubmit={onSubmit} noValidate>
        {actionData?.message ? <Notice tone="error">{actionData.message}</Notice> : null}
        <input type="hidden" name="next" value={loaderData.next} />
        <TextField label="Your name" name="name" autoComplete="name" required error={errors.name} />
        <TextField
          label="E-mail"
          name="email"
          type="email"
          autoComplete="email"
          defaultValue={loaderData.email}
          required
          error={errors.email}
        />
        <TextField
          label="Password"
          name="password"
          type="password"
          autoComplete="new-password"
          hint="At least 10 characters."
          required
          error={errors.password}
        />
        <Button type="submit" className="w-full" disabled={busy}>
          {busy ? "Creating…" : "Create account"}
        </Button>
      </Form>
    </AuthFrame>
  );
}
