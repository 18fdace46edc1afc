// @vitest-environment jsdom
// A page of a workspace that fails keeps the workspace's navigation: the shell's error boundary
// shows the error inside the shell (a thrown error and a 404 from a child's loader), and only a
// failure of the workspace itself (the shell's own loader) is shown as a page alone.
import { afterEach, describe, expect, it } from "vitest";
import { cleanup, render, screen, within } from "@testing-library/react";
import { createRoutesStub, Outlet, data } from "react-router";
import { Shell, type ShellProps } from "../../../app/components/shell";
import { WORKSPACE_SHELL_ID, WorkspaceErrorBoundary } from "../../../app/components/workspace-error";

afterEach(cleanup);

const shellData: Omit<ShellProps, "children"> = {
  workspace: { slug: "larkspur", name: "Larkspur Light Vehicles" },
  workspaces: [{ slug: "larkspur", name: "Larkspur Light Vehicles", role: "engineer" }],
  user: { name: "Ada Engineer", email: "engineer@example.com" },
  role: "engineer",
  demo: false,
  localMail: false,
};

function stub(child: () => unknown, shellLoader: () => unknown = () => shellData) {
  return createRoutesStub([
    {
      path: "/w/:ws",
      id: WORKSPACE_SHELL_ID,
      loader: shellLoader,
      Component: () => (
        <Shell {...shellData}>
          <Outlet />
        </Shell>
      ),
      ErrorBoundary: WorkspaceErrorBoundary,
      children: [
        { path: "designs/:designId", loader: child, Component: () => <p>design page</p> },
        { path: "vehicles", Component: () => <h1>Vehicles</h1> },
      ],
    },
  ]);
}

const sections = async () => within(await screen.findByRole("navigation", { name: "Sections" }));

describe("workspace error boundary", () => {
  it("a thrown error inside the workspace is shown inside the shell, navigation kept", async () => {
    const Stub = stub(() => {
      throw new Error("the database went away");
    });
    render(<Stub initialEntries={["/w/larkspur/designs/d1"]} />);
    expect(await screen.findByRole("heading", { name: "Something went wrong" })).toBeTruthy();
    const nav = await sections();
    for (const name of ["Vehicles", "Designs", "Reviews", "Bench tests", "Settings"]) expect(nav.getByRole("link", { name })).toBeTruthy();
    expect(screen.getByRole("link", { name: "Back to Larkspur Light Vehicles" }).getAttribute("href")).toBe("/w/larkspur");
    // The error is announced (role alert) where the page would have been.
    expect(screen.getByRole("alert").getAttribute("data-error-status")).toBe("error");
  });

  it("a 404 from a page's loader names what is missing, inside the shell", async () => {
    const Stub = stub(() => {
      throw data("This design has no revision 9.", { status: 404 });
    });
    render(<Stub initialEntries={["/w/larkspur/designs/d1"]} />);
    expect(await screen.findByRole("heading", { name: "Not found" })).toBeTruthy();
    expect(screen.getByText("This design has no revision 9.")).toBeTruthy();
    expect((await sections()).getByRole("link", { name: "Designs" }).getAttribute("href")).toBe("/w/larkspur/designs");
  });

  it("a workspace that cannot be shown is an error page alone, with no workspace navigation", async () => {
    const Stub = stub(
      () => null,
      () => {
        throw data("Not found", { status: 404 });
      },
    );
    render(<Stub initialEntries={["/w/elsewhere/designs/d1"]} />);
    expect(await screen.findByRole("heading", { name: "Not found" })).toBeTruthy();
    expect(screen.queryByRole("navigation", { name: "Sections" })).toBeNull();
    expect(screen.getByRole("link", { name: "Back to Chainproof" })).toBeTruthy();
  });
});
