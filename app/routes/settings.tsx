import { data, Form, useNavigation } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/settings";
import { requireMember } from "~/auth/guard.server";
import { CAN, ROLES, ROLE_DUTIES, ROLE_LABELS } from "~/lib/roles";
import { fieldErrors, formObject, inviteSchema, roleChangeSchema } from "~/lib/forms";
import { useFormCheck } from "~/lib/use-form-check";
import { changeRole, inviteMember, listMembers, listOpenInvitations, removeMember, revokeInvitation } from "~/workspace/workspace.server";
import { recentAudit } from "~/audit/audit.server";
import { PageHeader } from "~/components/page-header";
import { Button, Notice, SelectField, TextField } from "~/components/ui/form";

export const meta: Route.MetaFunction = () => [{ title: "Settings · Chainproof" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const m = await requireMember(request, params.ws, CAN.view);
  const isAdmin = m.role === "admin";
  const [members, invitations, audit] = await Promise.all([
    listMembers(m.workspace.id),
    isAdmin ? listOpenInvitations(m.workspace.id) : Promise.resolve([]),
    isAdmin ? recentAudit(m.workspace.id, 30) : Promise.resolve([]),
  ]);
  return {
    isAdmin,
    me: m.user.id,
    members,
    invitations: invitations.map((i) => ({ ...i, expiresAt: i.expiresAt.toISOString() })),
    audit: audit.map((a) => ({ ...a, at: a.at.toISOString() })),
  };
}

const idSchema = z.object({ id: z.string().min(1, "Missing id.") });

export async function action({ request, params }: Route.ActionArgs) {
  const m = await requireMember(request, params.ws, CAN.manageMembers);
  const form = await request.formData();
  const values = formObject(form);
  switch (values.intent) {
    case "invite": {
      const parsed = inviteSchema.safeParse(values);
      if (!parsed.success) return data({ intent: "invite", ok: false, fields: fieldErrors(parsed.error), message: null }, { status: 400 });
      await inviteMember(m.workspace, m.user, parsed.data.email, parsed.data.role);
      return { intent: "invite", ok: true, fields: {}, message: `Invitation sent to ${parsed.data.email}.` };
    }
    case "change-role": {
      const parsed = roleChangeSchema.safeParse(values);
      if (!parsed.success) return data({ intent: "change-role", ok: false, fields: fieldErrors(parsed.error), message: null }, { status: 400 });
      const r = await changeRole(m.workspace.id, m.user.id, parsed.data.memberId, parsed.data.role);
      if (!r.ok) return data({ intent: "change-role", ok: false, fields: {}, message: r.message }, { status: 400 });
      return { intent: "change-role", ok: true, fields: {}, message: "Role changed." };
    }
    case "remove": {
      const parsed = idSchema.safeParse(values);
      if (!parsed.success) return data({ intent: "remove", ok: false, fields: fieldErrors(parsed.error), message: null }, { status: 400 });
      const r = await removeMember(m.workspace.id, m.user.id, parsed.data.id);
      if (!r.ok) return data({ intent: "remove", ok: false, fields: {}, message: r.message }, { status: 400 });
      return { intent: "remove", ok: true, fields: {}, message: "Member removed." };
    }
    case "revoke": {
      const parsed = idSchema.safeParse(values);
      if (!parsed.success) return data({ intent: "revoke", ok: false, fields: fieldErrors(parsed.error), message: null }, { status: 400 });
      await revokeInvitation(m.workspace.id, m.user.id, parsed.data.id);
      return { intent: "revoke", ok: true, fields: {}, message: "Invitation withdrawn." };
    }
    default:
      return data({ intent: "unknown", ok: false, fields: { intent: "Unknown action." }, message: "Unknown action." }, { status: 400 });
  }
}

export default function Settings({ loaderData, actionData }: Route.ComponentProps) {
  const invite = useFormCheck(inviteSchema, actionData?.intent === "invite" ? actionData.fields : undefined);
  const busy = useNavigation().state === "submitting";
  return (
    <>
      <PageHeader title="Settings" description="Members of this workspace and their roles." />
      {actionData?.message ? <div className="mb-4"><Notice tone={actionData.ok ? "success" : "error"}>{actionData.message}</Notice></div> : null}
      <section className="rounded-lg border border-ink-200 bg-white">
        <h2 className="border-b border-ink-200 px-5 py-3 font-semibold">Members</h2>
        <ul className="divide-y divide-ink-100">
          {loaderData.members.map((member) => (
            <li key={member.id} className="flex flex-wrap items-center justify-between gap-3 px-5 py-3">
              <div>
                <p className="font-medium">{member.name}</p>
                <p className="text-sm text-ink-600">{member.email}</p>
              </div>
              {loaderData.isAdmin ? (
                <div className="flex flex-wrap items-center gap-2">
                  <Form method="post" className="flex items-center gap-2">
                    <input type="hidden" name="intent" value="change-role" />
                    <input type="hidden" name="memberId" value={member.id} />
                    <label className="sr-only" htmlFor={`role-${member.id}`}>Role of {member.email}</label>
                    <select id={`role-${member.id}`} name="role" defaultValue={member.role} className="rounded-md border border-ink-300 px-2 py-2 text-sm">
                      {ROLES.map((r) => <option key={r} value={r}>{ROLE_LABELS[r]}</option>)}
                    </select>
                    <Button tone="secondary" type="submit">Change</Button>
                  </Form>
                  {member.userId !== loaderData.me ? (
                    <Form method="post">
                      <input type="hidden" name="intent" value="remove" />
                      <input type="hidden" name="id" value={member.id} />
                      <Button tone="ghost" type="submit" aria-label={`Remove ${member.email}`}>Remove</Button>
                    </Form>
                  ) : null}
                </div>
              ) : (
                <span className="rounded-full bg-ink-100 px-3 py-1 text-xs font-medium">{ROLE_LABELS[member.role]}</span>
              )}
            </li>
          ))}
        </ul>
      </section>
      {loaderData.isAdmin ? (
        <>
          <section className="mt-6 max-w-xl rounded-lg border border-ink-200 bg-white p-5">
            <h2 className="font-semibold">Invite someone</h2>
            <Form method="post" className="mt-4 space-y-4" onSubmit={invite.onSubmit} noValidate>
              <input type="hidden" name="intent" value="invite" />
              <TextField label="E-mail" name="email" type="email" required error={invite.errors.email} />
              <SelectField label="Role" name="role" defaultValue="engineer" error={invite.errors.role}>
                {ROLES.map((r) => <option key={r} value={r}>{ROLE_LABELS[r]}: {ROLE_DUTIES[r]}</option>)}
              </SelectField>
              <Button type="submit" disabled={busy}>Send invitation</Button>
            </Form>
            {loaderData.invitations.length > 0 ? (
              <>
                <h3 className="mt-6 text-sm font-semibold">Waiting for an answer</h3>
                <ul className="mt-2 divide-y divide-ink-100 text-sm">
                  {loaderData.invitations.map((i) => (
                    <li key={i.id} className="flex items-center justify-between py-2">
                      <span>{i.email} · {ROLE_LABELS[i.role]}</span>
                      <Form method="post">
                        <input type="hidden" name="intent" value="revoke" />
                        <input type="hidden" name="id" value={i.id} />
                        <Button tone="ghost" type="submit">Withdraw</Button>
                      </Form>
                    </li>
                  ))}
                </ul>
              </>
            ) : null}
          </section>
          <section className="mt-6 rounded-lg border border-ink-200 bg-white p-5">
            <h2 className="font-semibold">Recent activity</h2>
            {loaderData.audit.length === 0 ? <p className="mt-2 text-sm text-ink-600">Nothing yet.</p> : (
              <ul className="mt-3 space-y-1 text-sm">
                {loaderData.audit.map((a) => (
                  <li key={a.id} className="flex flex-wrap gap-x-3">
                    <time className="text-ink-500" dateTime={a.at}>{a.at.slice(0, 16).replace("T", " ")}</time>
                    <span className="font-medium">{a.actor ?? "someone"}</span>
                    <span>{a.action}</span>
                    <span className="text-ink-600">{a.subject}</span>
                  </li>
                ))}
              </ul>
            )}
          </section>
        </>
      ) : null}
    </>
  );
}
