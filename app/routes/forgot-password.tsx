import { data, Form, Link } from "react-router";
import type { Route } from "./+types/forgot-password";
import { AuthFrame } from "~/components/auth-frame";
import { Button, Notice, TextField } from "~/components/ui/form";
import { fieldErrors, forgotSchema, formObject } from "~/lib/forms";
import { useFormCheck } from "~/lib/use-form-check";
import { callAuth } from "~/auth/forms.server";

export const meta: Route.MetaFunction = () => [{ title: "Reset your password · Chainproof" }];

export async function loader() {
  return null; // Public page: nothing to load and nobody to check.
}

export async function action({ request }: Route.ActionArgs) {
  const parsed = forgotSchema.safeParse(formObject(await request.formData()));
  if (!parsed.success) return data({ fields: fieldErrors(parsed.error), sent: false }, { status: 400 });
  // The answer is the same whether or not the address has an account.
  await callAuth(request, "/request-password-reset", { email: parsed.data.email, redirectTo: "/reset-password" });
  return { fields: {}, sent: true };
}

export default function ForgotPassword({ actionData }: Route.ComponentProps) {
  const { errors, onSubmit } = useFormCheck(forgotSchema, actionData?.fields);
  return (
    <AuthFrame
      title="Reset your password"
      footer={
        <Link className="text-copper-700 underline" to="/sign-in">
          Back to sign in
        </Link>
      }
    >
      {actionData?.sent ? (
        <Notice tone="success">If that address has an account, a reset link is on its way.</Notice>
      ) : (
        <Form method="post" className="space-y-4" onSubmit={onSubmit} noValidate>
          <TextField label="E-mail" name="email" type="email" autoComplete="email" required error={errors.email} />
          <Button type="submit" className="w-full">
            Send the link
          </Button>
        </Form>
      )}
    </AuthFrame>
  );
}
