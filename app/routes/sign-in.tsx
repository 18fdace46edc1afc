import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/sign-in";
import { AuthFrame } from "~/components/auth-frame";
import { Button, Notice, TextField } from "~/components/ui/form";
import { fieldErrors, formObject, signInSchema } from "~/lib/forms";
import { safeNext } from "~/lib/safe-next";
import { useFormCheck } from "~/lib/use-form-check";
import { getSignedIn } from "~/auth/guard.server";
import { authErrorMessage, callAuth, cookiesOf } from "~/auth/forms.server";
import { recordAudit } from "~/audit/audit.server";

export const meta: Route.MetaFunction = () => [{ title: "Sign in · Chainproof" }];

export async function loader({ request }: Route.LoaderArgs) {
  const url = new URL(request.url);
  if (await getSignedIn(request)) throw redirect(safeNext(url.searchParams.get("next")));
  return {
    next: safeNext(url.searchParams.get("next")),
    notice: url.searchParams.get("verified") ? "verified" : url.searchParams.get("reset") ? "reset" : null,
  };
}

export async function action({ request }: Route.ActionArgs) {
  const form = await request.formData();
  const parsed = signInSchema.safeParse(formObject(form));
  if (!parsed.success) return data({ fields: fieldErrors(parsed.error), message: null }, { status: 400 });
  const response = await callAuth(request, "/sign-in/email", parsed.data);
  if (!response.ok) {
    const { code, message } = await authErrorMessage(response);
    const text =
      code === "EMAIL_NOT_VERIFIED"
        ? "Confirm your e-mail address first: we have sent you a new link."
        : code === "rate_limited"
          ? message
          : "That e-mail and password do not match an account.";
    await recordAudit({ action: "sign-in.failed", subject: parsed.data.email, detail: { code } });
    return data({ fields: {}, message: text }, { status: response.status === 429 ? 429 : 400 });
  }
  const body = (await response.json()) as { user?: { id: string } };
  await recordAudit({ action: "sign-in", actorId: body.user?.id ?? null, subject: parsed.data.email });
  return redirect(safeNext(String(form.get("next") ?? "")), { headers: cookiesOf(response) });
}

export default function SignIn({ loaderData, actionData }: Route.ComponentProps) {
  const { errors, onSubmit } = useFormCheck(signInSchema, actionData?.fields);
  const busy = useNavigation().state === "submitting";
  return (
    <AuthFrame
      title="Sign in"
      footer={
        <>
          New here?{" "}
          <Link className="font-semibold text-copper-700 underline" to="/sign-up">
            Create an account
          </Link>
        </>
      }
    >
      <div className="space-y-4">
        {loaderData.notice === "verified" ? <Notice tone="success">Your address is confirmed. Sign in to continue.</Notice> : null}
        {loaderData.notice === "reset" ? <Notice tone="success">Your password was changed. Sign in with the new one.</Notice> : null}
        {actionData?.message ? <Notice tone="error">{actionData.message}</Notice> : null}
        <Form method="post" className="space-y-4" onSubmit={onSubmit} noValidate>
          <input type="hidden" name="next" value={loaderData.next} />
          <TextField label="E-mail" name="email" type="email" autoComplete="email" required error={errors.email} />
          <TextField label="Password" name="password" type="password" autoComplete="current-password" required error={errors.password} />
          <Button type="submit" className="w-full" disabled={busy}>
            {busy ? "Signing in…" : "Sign in"}
          </Button>
        </Form>
        <p className="text-sm">
          <Link className="text-copper-700 underline" to="/forgot-password">
            Forgot your password?
          </Link>
        </p>
      </div>
    </AuthFrame>
  );
}
