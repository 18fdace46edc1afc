// Who may do what (decision 151): the workspace middleware puts the member in the request context
// once; requireCan answers 403 for a role that may not, and fails closed (an error, never a pass)
// for a route that has no member in its context. can() is checked against the duties each role
// has in the product, written out here by hand rather than read from the code's table.
import { RouterContextProvider } from "react-router";
import { describe, expect, it, vi } from "vitest";
import { can, ROLES, type Action, type Role } from "~/lib/roles";

const member = (role: Role) => ({
  user: { id: "u1", email: "a@example.org", name: "A" },
  sessionId: "s1",
  workspace: { id: "w1", slug: "larkspur", name: "Larkspur" },
  role,
});

let current: Role = "engineer";
vi.mock("~/auth/guard.server", () => ({
  requireMember: vi.fn(async () => member(current)),
  workspacesFor: vi.fn(async () => [{ id: "w1", slug: "larkspur", name: "Larkspur", role: current }]),
  getSignedIn: vi.fn(),
  requireUser: vi.fn(),
}));

const { requireCan, workspaceMember, workspacesIn } = await import("~/auth/context.server");

async function contextFor(role: Role) {
  current = role;
  const context = new RouterContextProvider();
  const request = new Request("http://localhost/w/larkspur");
  await workspaceMember({ request, params: { ws: "larkspur" }, context, unstable_pattern: "/w/:ws" } as never, async () => new Response());
  return context;
}

// By hand, from the product's duties (README "Roles", decisions 070 and 161), not from PERMISSIONS.
const MAY: Record<Action, Role[]> = {
  "workspace.view": ["admin", "engineer", "technician", "reviewer"],
  "members.manage": ["admin"],
  "design.edit": ["engineer"],
  // Issue 15: engineers and admins archive designs and bring them back (decision 167).
  "design.archive": ["admin", "engineer"],
  "vehicle.manage": ["admin", "engineer", "technician"],
  "bench.run": ["technician"],
  "revision.release": ["admin", "engineer"],
  "review.decide": ["reviewer"],
  // Decision 164: those who draw, sign off or run the workspace read its design events.
  "design-events.read": ["admin", "engineer", "reviewer"],
  "fault.dispose": ["engineer", "reviewer"],
  "controller.record": ["engineer", "technician"],
};

describe("can(role, action)", () => {
  it("allows exactly the roles whose duty the action is", () => {
    for (const action of Object.keys(MAY) as Action[]) {
      for (const role of ROLES) expect(can(role, action), `${role} ${action}`).toBe(MAY[action].includes(role));
    }
  });
});

describe("requireCan", () => {
  it("gives the member the workspace middleware found when the role may", async () => {
    const context = await contextFor("engineer");
    expect(requireCan(context, "design.edit")).toMatchObject({ role: "engineer", workspace: { slug: "larkspur" } });
    expect(workspacesIn(context).map((w) => w.slug)).toEqual(["larkspur"]);
  });

  it("answers 403 for a role that may not, whatever the layout let through", async () => {
    const context = await contextFor("technician");
    let thrown: unknown;
    try {
      requireCan(context, "design.edit");
    } catch (e) {
      thrown = e;
    }
    expect(thrown).toBeInstanceOf(Response);
    expect((thrown as Response).status).toBe(403);
  });

  it("fails closed when no middleware put a member in the context", () => {
    expect(() => requireCan(new RouterContextProvider(), "workspace.view")).toThrow(/no workspace member/);
  });
});
