import { data, Form, useNavigation } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/settings";
import { requireCan } from "~/auth/context.server";
import { can, ROLES, ROLE_DUTIES, ROLE_LABELS } from "~/lib/roles";
import { fieldErrors, formObject, inviteSchema, roleChangeSchema } from "~/lib/forms";
import { useFormCheck } from "~/lib/use-form-check";
import { ID_MAX, storable } from "~/lib/text";
import { changeRole, inviteMember, listMembers, listOpenInvitations, removeMember, revokeInvitation } from "~/workspace/workspace.server";
import { recentAudit } from "~/audit/audit.server";
import { createApiKey, listApiKeys, revokeApiKey } from "~/auth/api-keys.server";
import { PageHeader } from "~/components/page-header";
import { Button, Notice, SelectField, TextField } from "~/components/ui/form";
import { cardVariants } from "~/components/ui/card";
import { Badge } from "~/components/ui/badge";

export const meta: Route.MetaFunction = () => [{ title: "Settings · Chainproof" }];

export async function loader({ context }: Route.LoaderArgs) {
  const m = requireCan(context, "workspace.view");
  const isAdmin = can(m.role, "members.manage");
  const [members, invitations, audit, keys] = await Promise.all([
    listMembers(m.workspace.id),
    isAdmin ? listOpenInvitations(m.workspace.id) : Promise.resolve([]),
    isAdmin ? recentAudit(m.workspace.id, 30) : Promise.resolve([]),
    listApiKeys(m.workspace.id, m.user.id),
  ]);
  // Only admins manage members, so only they need each member's address and ids; others see names
  // and roles (and their own address). An address and a user id are what an account takeover needs.
  const visible = isAdmin
    ? members
    : members.map((x, i) => {
        const self = x.userId === m.user.id;
        return {
          id: `member-${i + 1}`,
          role: x.role,
          userId: self ? x.userId : `member-${i + 1}`,
          name: x.name,
          email: self ? x.email : null,
        };
      });
  return {
    isAdmin,
    me: m.user.id,
    members: visible,
    invitations: invitations.map((i) => ({ ...i, expiresAt: i.expiresAt.toISOString() })),
    audit: audit.map((a) => ({ ...a, at: a.at.toISOString() })),
    keys: keys.map((k) => ({
      id: k.id,
      name: k.name,
      prefix: k.prefix,
      createdAt: k.createdAt.toISOString(),
      lastUsedAt: k.lastUsedAt?.toISOString() ?? null,
    })),
  };
}

const idSchema = z.object({ id: storable(z.string().min(1, "Missing id.").max(ID_MAX, "No such id.")) });
const keyNameSchema = z.object({
  name: storable(z.string().trim().min(1, "Name the key, e.g. after the script that uses it.").max(80, "Use at most 80 characters.")),
});

export async function action({ request, context }: Route.ActionArgs) {
  const form = await request.formData();
  const values = formObject(form);
  // Personal API keys: every member manages their own.
  if (values.intent === "create-key" || values.intent === "revoke-key") {
    const me = requireCan(context, "workspace.view");
    if (values.intent === "create-key") {
      const parsed = keyNameSchema.safeParse(values);
      if (!parsed.success)
        return data({ intent: "create-key", ok: false, fields: fieldErrors(parsed.error), message: null, newKey: null }, { status: 400 });
      const created = await createApiKey(me.workspace.id, me.user.id, parsed.data.name);
      return {
        intent: "create-key",
        ok: true,
        fields: {},
        message: "Key created. Copy it now: it is shown only once.",
        newKey: created.key,
      };
    }
    const parsed = idSchema.safeParse(values);
    if (!parsed.success || !(await revokeApiKey(me.workspace.id, me.user.id, parsed.data.id)))
      return data({ intent: "revoke-key", ok: false, fields: {}, message: "No such key.", newKey: null }, { status: 400 });
    return { intent: "revoke-key", ok: true, fields: {}, message: "Key revoked.", newKey: null };
  }
  const m = requireCan(context, "members.manage");
  switch (values.intent) {
    case "invite": {
      const parsed = inviteSchema.safeParse(values);
      if (!parsed.success)
        return data({ intent: "invite", ok: false, fields: fieldErrors(parsed.error), message: null, newKey: null }, { status: 400 });
      await inviteMember(m.workspace, m.user, parsed.data.email, parsed.data.role);
      return { intent: "invite", ok: true, fields: {}, message: `Invitation sent to ${parsed.data.email}.`, newKey: null };
    }
    case "change-role": {
      const parsed = roleChangeSchema.safeParse(values);
      if (!parsed.success) {
        // The member is a hidden field: the refusal is named above the list.
        const fields = fieldErrors(parsed.error);
        const message = fields.memberId ? "No such member." : (fields.role ?? "Choose a role.");
        return data({ intent: "change-role", ok: false, fields, message, newKey: null }, { status: 400 });
      }
      const r = await changeRole(m.workspace.id, m.user.id, parsed.data.memberId, parsed.data.role);
      if (!r.ok) return data({ intent: "change-role", ok: false, fields: {}, message: r.message, newKey: null }, { status: 400 });
      return { intent: "change-role", ok: true, fields: {}, message: "Role changed.", newKey: null };
    }
    case "remove": {
      const parsed = idSchema.safeParse(values);
      if (!parsed.success)
        return data(
          { intent: "remove", ok: false, fields: fieldErrors(parsed.error), message: "No such member.", newKey: null },
          { status: 400 },
        );
      const r = await removeMember(m.workspace.id, m.user.id, parsed.data.id);
      if (!r.ok) return data({ intent: "remove", ok: false, fields: {}, message: r.message, newKey: null }, { status: 400 });
      return { intent: "remove", ok: true, fields: {}, message: "Member removed.", newKey: null };
    }
    case "revoke": {
      const parsed = idSchema.safeParse(values);
      if (!parsed.success)
        return data(
          {
            intent: "revoke",
            ok: false,
            fields: fieldErrors(parsed.error),
            message: "No such open invitation in this workspace.",
            newKey: null,
          },
          { status: 400 },
        );
      if (!(await revokeInvitation(m.workspace.id, m.user.id, parsed.data.id)))
        return data(
          { intent: "revoke", ok: false, fields: {}, message: "No such open invitation in this workspace.", newKey: null },
          { status: 404 },
        );
      return { intent: "revoke", ok: true, fields: {}, message: "Invitation withdrawn.", newKey: null };
    }
    default:
      return data(
        { intent: "unknown", ok: false, fields: { intent: "Unknown action." }, message: "Unknown action.", newKey: null },
        { status: 400 },
      );
  }
}

export default function Settings({ loaderData, actionData }: Route.ComponentProps) {
  const invite = useFormCheck(inviteSchema, actionData?.intent === "invite" ? actionData.fields : undefined);
  const busy = useNavigation().state === "submitting";
  return (
    <>
      <PageHeader title="Settings" description="Members of this workspace and their roles." />
      {actionData?.message ? (
        <div className="mb-4">
          <Notice tone={actionData.ok ? "success" : "error"}>{actionData.message}</Notice>
        </div>
      ) : null}
      <section className={cardVariants({ padding: "none" })}>
        <h2 className="border-b border-ink-200 px-5 py-3 font-semibold">Members</h2>
        <ul className="divide-y divide-ink-100">
          {loaderData.members.map((member) => (
            <li key={member.id} className="flex flex-wrap items-center justify-between gap-3 px-5 py-3">
              <div>
                <p className="font-medium">{member.name}</p>
                {member.email ? <p className="text-sm text-ink-600">{member.email}</p> : null}
              </div>
              {loaderData.isAdmin ? (
                <div className="flex flex-wrap items-center gap-2">
                  <Form method="post" className="flex items-center gap-2">
                    <input type="hidden" name="intent" value="change-role" />
                    <input type="hidden" name="memberId" value={member.id} />
                    <label className="sr-only" htmlFor={`role-${member.id}`}>
                      Role of {member.email}
                    </label>
                    <select
                      id={`role-${member.id}`}
                      name="role"
                      defaultValue={member.role}
                      className="rounded-md border border-ink-300 px-2 py-2 text-sm"
                    >
                      {ROLES.map((r) => (
                        <option key={r} value={r}>
                          {ROLE_LABELS[r]}
                        </option>
                      ))}
                    </select>
                    <Button tone="secondary" type="submit">
                      Change
                    </Button>
                  </Form>
                  {member.userId !== loaderData.me ? (
                    <Form method="post">
                      <input type="hidden" name="intent" value="remove" />
                      <input type="hidden" name="id" value={member.id} />
                      <Button tone="ghost" type="submit" aria-label={`Remove ${member.email}`}>
                        Remove
                      </Button>
                    </Form>
                  ) : null}
                </div>
              ) : (
                <Badge tone="quiet">{ROLE_LABELS[member.role]}</Badge>
              )}
            </li>
          ))}
        </ul>
      </section>
      <section className={cardVariants({ padding: "lg", className: "mt-6 max-w-xl" })}>
        <h2 className="font-semibold">Your API keys</h2>
        <p className="mt-1 text-sm text-ink-600">
          A key acts for you, with your role, in this workspace only. Send it as <code>Authorization: Bearer …</code>; the API is described
          at{" "}
          <a className="text-copper-700 underline" href="/api/v1/docs">
            /api/v1/docs
          </a>
          .
        </p>
        {actionData?.newKey ? (
          <div className="mt-3 rounded-md border border-moss-600 bg-moss-50 p-3">
            <p className="text-sm font-medium text-moss-700">Your new key (shown once):</p>
            <code className="mt-1 block break-all text-sm" data-testid="new-api-key">
              {actionData.newKey}
            </code>
          </div>
        ) : null}
        {loaderData.keys.length > 0 ? (
          <ul className="mt-3 divide-y divide-ink-100 text-sm">
            {loaderData.keys.map((k) => (
              <li key={k.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                <span>
                  <span className="font-medium">{k.name}</span> <code className="text-ink-600">{k.prefix}…</code>
                  <span className="block text-xs text-ink-500">
                    created {k.createdAt.slice(0, 10)}
                    {k.lastUsedAt ? `, last used ${k.lastUsedAt.slice(0, 16).replace("T", " ")}` : ", never used"}
                  </span>
                </span>
                <Form method="post">
                  <input type="hidden" name="intent" value="revoke-key" />
                  <input type="hidden" name="id" value={k.id} />
                  <Button tone="ghost" type="submit" aria-label={`Revoke key ${k.name}`}>
                    Revoke
                  </Button>
                </Form>
              </li>
            ))}
          </ul>
        ) : null}
        <Form method="post" className="mt-4 flex flex-wrap items-end gap-3">
          <input type="hidden" name="intent" value="create-key" />
          <div className="min-w-56 flex-1">
            <TextField
              label="Key name"
              name="name"
              required
              error={actionData?.intent === "create-key" ? (actionData.fields as Record<string, string>).name : undefined}
            />
          </div>
          <Button type="submit" tone="secondary">
            Create key
          </Button>
        </Form>
      </section>
      {loaderData.isAdmin ? (
        <>
          <section className={cardVariants({ padding: "lg", className: "mt-6 max-w-xl" })}>
            <h2 className="font-semibold">Invite someone</h2>
            <Form method="post" className="mt-4 space-y-4" onSubmit={invite.onSubmit} noValidate>
              <input type="hidden" name="intent" value="invite" />
              <TextField label="E-mail" name="email" type="email" required error={invite.errors.email} />
              <SelectField label="Role" name="role" defaultValue="engineer" error={invite.errors.role}>
                {ROLES.map((r) => (
                  <option key={r} value={r}>
                    {ROLE_LABELS[r]}: {ROLE_DUTIES[r]}
                  </option>
                ))}
              </SelectField>
              <Button type="submit" disabled={busy}>
                Send invitation
              </Button>
            </Form>
            {loaderData.invitations.length > 0 ? (
              <>
                <h3 className="mt-6 text-sm font-semibold">Waiting for an answer</h3>
                <ul className="mt-2 divide-y divide-ink-100 text-sm">
                  {loaderData.invitations.map((i) => (
                    <li key={i.id} className="flex items-center justify-between py-2">
                      <span>
                        {i.email} · {ROLE_LABELS[i.role]}
                      </span>
                      <Form method="post">
                        <input type="hidden" name="intent" value="revoke" />
                        <input type="hidden" name="id" value={i.id} />
                        <Button tone="ghost" type="submit">
                          Withdraw
                        </Button>
                      </Form>
                    </li>
                  ))}
                </ul>
              </>
            ) : null}
          </section>
          <section className={cardVariants({ padding: "lg", className: "mt-6" })}>
            <h2 className="font-semibold">Recent activity</h2>
            {loaderData.audit.length === 0 ? (
              <p className="mt-2 text-sm text-ink-600">Nothing yet.</p>
            ) : (
              <ul className="mt-3 space-y-1 text-sm">
                {loaderData.audit.map((a) => (
                  <li key={a.id} className="flex flex-wrap gap-x-3">
                    <time className="text-ink-500" dateTime={a.at}>
                      {a.at.slice(0, 16).replace("T", " ")}
                    </time>
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
