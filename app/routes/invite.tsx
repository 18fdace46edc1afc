import { data, Form, Link, redirect } from "react-router";
import type { Route } from "./+types/invite";
import { AuthFrame } from "~/components/auth-frame";
import { Button, Notice } from "~/components/ui/form";
import { getSignedIn, requireUser } from "~/auth/guard.server";
import { acceptInvitation, findInvitation } from "~/workspace/workspace.server";
import { ROLE_DUTIES, ROLE_LABELS } from "~/lib/roles";

export const meta: Route.MetaFunction = () => [{ title: "Invitation · Chainproof" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  // Public: the token itself is the credential to see the invitation; accepting needs a session.
  const inv = await findInvitation(params.token);
  const signedIn = await getSignedIn(request);
  const valid = !!inv && !inv.acceptedAt && !inv.revokedAt && inv.expiresAt > new Date();
  return {
    valid,
    invitation: valid && inv ? { email: inv.email, role: inv.role, workspaceName: inv.workspaceName } : null,
    signedInAs: signedIn?.user.email ?? null,
    path: new URL(request.url).pathname,
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const { user } = await requireUser(request);
  const result = await acceptInvitation(params.token, user);
  if (!result.ok) return data({ message: result.reason }, { status: 400 });
  const inv = await findInvitation(params.token);
  return redirect(inv ? `/w/${inv.workspaceSlug}` : "/");
}

export default function Invite({ loaderData, actionData }: Route.ComponentProps) {
  const { invitation, signedInAs, path } = loaderData;
  if (!invitation) {
    return (
      <AuthFrame title="Invitation not valid">
        <Notice tone="error">This invitation was used, withdrawn or has expired. Ask your workspace admin for a new one.</Notice>
      </AuthFrame>
    );
  }
  return (
    <AuthFrame title={`Join ${invitation.workspaceName}`}>
      <p className="text-sm text-ink-700">
        You are invited as <strong>{ROLE_LABELS[invitation.role]}</strong>, to {ROLE_DUTIES[invitation.role]}. The invitation is for{" "}
        <strong>{invitation.email}</strong>.
      </p>
      {actionData?.message ? (
        <div className="mt-4">
          <Notice tone="error">{actionData.message}</Notice>
        </div>
      ) : null}
      {signedInAs ? (
        <Form method="post" className="mt-5">
          <p className="mb-3 text-sm text-ink-600">Signed in as {signedInAs}.</p>
          <Button type="submit" className="w-full">
            Accept and join
          </Button>
        </Form>
      ) : (
        <div className="mt-5 flex flex-col gap-3">
          <Link className="text-center font-semibold text-copper-700 underline" to={`/sign-in?next=${encodeURIComponent(path)}`}>
            Sign in to accept
          </Link>
          <Link
            className="text-center text-sm text-copper-700 underline"
            to={`/sign-up?next=${encodeURIComponent(path)}&email=${encodeURIComponent(invitation.email)}`}
          >
            No account yet? Create one with {invitation.email}
          </Link>
        </div>
      )}
    </AuthFrame>
  );
}
