// @vitest-environment jsdom
// The UI kit's primitives: each renders the element it claims, with the role-named classes of its
// variant, forwards what it is given, and (the dialog) opens, names itself and asks to close.
import { useState } from "react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { cleanup, fireEvent, render, screen, within } from "@testing-library/react";
import { createMemoryRouter, RouterProvider } from "react-router";
import { Button, buttonVariants, Chip } from "../../../app/components/ui/button";
import { ButtonLink } from "../../../app/components/ui/link";
import { Card, CardSection } from "../../../app/components/ui/card";
import { Badge } from "../../../app/components/ui/badge";
import { Dialog } from "../../../app/components/ui/dialog";
import { Table, TBody, Td, Th, THead } from "../../../app/components/ui/table";
import { buttonClass } from "../../../app/components/ui/form";
import { Tab, TabList } from "../../../app/components/ui/tabs";

afterEach(cleanup);

const classes = (el: Element) => el.className.split(/\s+/);

describe("Button", () => {
  it("is a native button with the action look by default and submits like one", () => {
    const onSubmit = vi.fn((e: { preventDefault: () => void }) => e.preventDefault());
    render(
      <form onSubmit={onSubmit}>
        <Button>Save</Button>
      </form>,
    );
    const b = screen.getByRole("button", { name: "Save" });
    expect(classes(b)).toEqual(expect.arrayContaining(["bg-action", "text-white", "min-h-10"]));
    fireEvent.click(b);
    expect(onSubmit).toHaveBeenCalledTimes(1);
  });

  it("takes a variant, a size, extra classes and the button's own attributes", () => {
    const onClick = vi.fn();
    render(
      <Button variant="danger" size="sm" className="ml-2" type="button" disabled onClick={onClick} aria-label="Delete part">
        ×
      </Button>,
    );
    const b = screen.getByRole("button", { name: "Delete part" });
    expect(classes(b)).toEqual(expect.arrayContaining(["bg-failing", "px-2", "ml-2"]));
    expect(classes(b)).not.toContain("bg-action");
    expect(b).toHaveProperty("disabled", true);
    fireEvent.click(b);
    expect(onClick).not.toHaveBeenCalled();
  });

  it("gives each variant its own role colour", () => {
    expect(buttonVariants({ variant: "secondary" })).toContain("border-line-strong");
    expect(buttonVariants({ variant: "ghost" })).toContain("hover:bg-subtle");
    expect(buttonVariants({ variant: "link" })).toContain("text-action-ink");
  });

  it("lays its content in a row by default, or as a block of lines, without the row's classes", () => {
    expect(classes(render(<Button>Row</Button>).getByRole("button"))).toEqual(expect.arrayContaining(["inline-flex", "gap-2"]));
    cleanup();
    const block = classes(
      render(
        <Button layout="block" variant="option" size="option">
          Step 1
        </Button>,
      ).getByRole("button"),
    );
    expect(block).toEqual(expect.arrayContaining(["block", "w-full", "text-left", "border-line"]));
    expect(block).not.toContain("inline-flex");
    cleanup();
    const token = classes(
      render(
        <Button layout="tight" variant="token" size="pill">
          key = off
        </Button>,
      ).getByRole("button"),
    );
    // One gap only: two gap classes would leave the wider one winning.
    expect(token.filter((c) => c.startsWith("gap-"))).toEqual(["gap-1"]);
  });

  it("keeps the older buttonClass tones on the same looks", () => {
    expect(buttonClass()).toBe(buttonVariants({ variant: "action", className: "" }));
    expect(buttonClass("secondary", "px-3")).toBe(buttonVariants({ variant: "secondary", className: "px-3" }));
  });
});

describe("Chip", () => {
  it("is a toggle button whose pressed state is announced and drawn in the action colour", () => {
    const onClick = vi.fn();
    render(
      <div>
        <Chip pressed onClick={onClick}>
          occupied
        </Chip>
        <Chip pressed={false}>empty</Chip>
      </div>,
    );
    const on = screen.getByRole("button", { name: "occupied", pressed: true });
    const off = screen.getByRole("button", { name: "empty", pressed: false });
    expect(on.getAttribute("type")).toBe("button");
    expect(classes(on)).toContain("aria-pressed:bg-action");
    expect(classes(on)).not.toContain("bg-surface");
    expect(classes(off)).toContain("bg-surface");
    fireEvent.click(on);
    expect(onClick).toHaveBeenCalledTimes(1);
  });
});

describe("Chip tones", () => {
  it("draws a recorded outcome in its role colour when pressed", () => {
    render(
      <div>
        <Chip pressed tone="proven" size="bench">
          Pass
        </Chip>
        <Chip pressed={false} tone="failing" size="bench">
          Fail
        </Chip>
      </div>,
    );
    expect(classes(screen.getByRole("button", { name: "Pass", pressed: true }))).toEqual(
      expect.arrayContaining(["aria-pressed:bg-proven", "min-h-12"]),
    );
    const fail = classes(screen.getByRole("button", { name: "Fail", pressed: false }));
    expect(fail).toEqual(expect.arrayContaining(["aria-pressed:bg-failing", "bg-surface"]));
  });
});

describe("Tabs", () => {
  it("are tabs in a tab list; the selected one is announced and drawn in the action colour", () => {
    const onClick = vi.fn();
    render(
      <TabList aria-label="Panels">
        <Tab selected aria-controls="p">
          Properties
        </Tab>
        <Tab selected={false} aria-controls="p" onClick={onClick}>
          Rules
        </Tab>
      </TabList>,
    );
    const list = screen.getByRole("tablist", { name: "Panels" });
    const on = within(list).getByRole("tab", { name: "Properties", selected: true });
    const off = within(list).getByRole("tab", { name: "Rules", selected: false });
    expect(on.getAttribute("type")).toBe("button");
    expect(classes(on)).toEqual(expect.arrayContaining(["border-action", "text-action-ink"]));
    expect(classes(off)).not.toContain("border-action");
    fireEvent.click(off);
    expect(onClick).toHaveBeenCalledTimes(1);
  });
});

describe("ButtonLink", () => {
  it("is a link to its URL that looks like a button", () => {
    const router = createMemoryRouter([
      {
        path: "/",
        element: (
          <ButtonLink to="/w/demo/designs/new" variant="secondary">
            New design
          </ButtonLink>
        ),
      },
    ]);
    render(<RouterProvider router={router} />);
    const a = screen.getByRole("link", { name: "New design" });
    expect(a.getAttribute("href")).toBe("/w/demo/designs/new");
    expect(classes(a)).toEqual(expect.arrayContaining(["border-line-strong", "bg-surface"]));
  });
});

describe("Card and Badge", () => {
  it("Card renders the element asked for, with its padding", () => {
    render(
      <Card as="section" padding="lg" aria-label="Members" className="mt-6">
        body
      </Card>,
    );
    const s = screen.getByRole("region", { name: "Members" });
    expect(s.tagName).toBe("SECTION");
    expect(classes(s)).toEqual(expect.arrayContaining(["rounded-lg", "border-line", "bg-surface", "p-5", "mt-6"]));
  });

  it("CardSection titles its content with a heading", () => {
    render(
      <CardSection title="Revision history" aside={<a href="#x">All</a>}>
        rows
      </CardSection>,
    );
    const h = screen.getByRole("heading", { level: 2, name: "Revision history" });
    expect(h.closest("section")?.textContent).toContain("rows");
    expect(screen.getByRole("link", { name: "All" })).toBeTruthy();
  });

  it("Badge carries its word and tone", () => {
    render(<Badge tone="proven">Proven</Badge>);
    const b = screen.getByText("Proven");
    expect(b.tagName).toBe("SPAN");
    expect(classes(b)).toEqual(expect.arrayContaining(["bg-proven-soft", "text-proven-ink", "rounded-full"]));
  });
});

describe("Dialog", () => {
  function Harness({ onClose }: { onClose?: () => void }) {
    const [open, setOpen] = useState(false);
    return (
      <>
        <button type="button" onClick={() => setOpen(true)}>
          Import
        </button>
        <Dialog
          open={open}
          onClose={() => {
            onClose?.();
            setOpen(false);
          }}
          title="plan.json has 2 problems"
          actions={
            <Button type="button" variant="secondary" onClick={() => setOpen(false)}>
              Cancel
            </Button>
          }
        >
          <p>Contact k1 has no terminals.</p>
        </Dialog>
      </>
    );
  }

  it("is closed until opened, then named by its title with its content and actions", () => {
    const { container } = render(<Harness />);
    expect(screen.queryByRole("dialog")).toBeNull();
    fireEvent.click(screen.getByRole("button", { name: "Import" }));
    const d = screen.getByRole("dialog", { name: "plan.json has 2 problems" });
    expect(d.hasAttribute("open")).toBe(true);
    expect(within(d).getByText("Contact k1 has no terminals.")).toBeTruthy();
    fireEvent.click(within(d).getByRole("button", { name: "Cancel" }));
    expect(container.querySelector("dialog")?.hasAttribute("open")).toBe(false);
  });

  it("asks its owner to close on Escape", () => {
    const onClose = vi.fn();
    render(<Harness onClose={onClose} />);
    fireEvent.click(screen.getByRole("button", { name: "Import" }));
    fireEvent.keyDown(screen.getByRole("dialog"), { key: "Escape" });
    expect(onClose).toHaveBeenCalledTimes(1);
    expect(screen.queryByRole("dialog")).toBeNull();
  });
});

describe("Table", () => {
  it("is a table with column headers and cells, padded by variant", () => {
    render(
      <Table aria-label="History">
        <THead>
          <tr>
            <Th pad="edge">Revision</Th>
            <Th>Author</Th>
          </tr>
        </THead>
        <TBody>
          <tr>
            <Td pad="edge">3</Td>
            <Td>Ada</Td>
          </tr>
        </TBody>
      </Table>,
    );
    const t = screen.getByRole("table", { name: "History" });
    const headers = within(t).getAllByRole("columnheader");
    expect(headers.map((h) => h.textContent)).toEqual(["Revision", "Author"]);
    expect(headers[0].getAttribute("scope")).toBe("col");
    expect(classes(headers[0])).toContain("px-5");
    expect(classes(within(t).getByRole("cell", { name: "Ada" }))).toContain("px-3");
  });
});
