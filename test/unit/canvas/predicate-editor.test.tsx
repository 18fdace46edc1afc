// @vitest-environment jsdom
import { useState } from "react";
import { afterEach, describe, expect, it } from "vitest";
import { cleanup, fireEvent, render, screen, within } from "@testing-library/react";
import type { Condition, Predicate } from "../../../app/engine";
import { PredicateEditor } from "../../../app/canvas/panels/predicate-editor";

const conditions: Condition[] = [
  { id: "plug", label: "Charge inlet", states: ["free", "inserted"] },
  { id: "seat", label: "Operator seat", states: ["empty", "occupied"] },
  { id: "gear", label: "Direction selector", states: ["forward", "neutral", "reverse"] },
];

function Harness({ initial, seen }: { initial: Predicate; seen: Predicate[] }) {
  const [value, setValue] = useState(initial);
  return (
    <PredicateEditor
      value={value}
      conditions={conditions}
      onChange={(p) => {
        seen.push(p);
        setValue(p);
      }}
    />
  );
}

afterEach(cleanup);

describe("rule picker", () => {
  it("builds 'plug is inserted' from a fresh condition test", () => {
    const seen: Predicate[] = [];
    render(<Harness initial={{ cond: "plug", in: [] }} seen={seen} />);
    fireEvent.click(screen.getByRole("button", { name: "inserted" }));
    expect(seen.at(-1)).toEqual({ cond: "plug", in: ["inserted"] });
    expect(screen.getByRole("button", { name: "inserted" }).getAttribute("aria-pressed")).toBe("true");
  });

  it("builds any(plug in [inserted], not(seat in [occupied])) with groups and not", () => {
    const seen: Predicate[] = [];
    render(<Harness initial={{ cond: "plug", in: ["inserted"] }} seen={seen} />);
    // Turn the single test into "any of", keeping it as the first member.
    fireEvent.change(screen.getByLabelText("Forbidden when"), { target: { value: "any" } });
    expect(seen.at(-1)).toEqual({ any: [{ cond: "plug", in: ["inserted"] }] });
    fireEvent.click(screen.getByRole("button", { name: "+ Condition test" }));
    expect(seen.at(-1)).toEqual({
      any: [
        { cond: "plug", in: ["inserted"] },
        { cond: "plug", in: [] },
      ],
    });
    // Second member: seat, then negate it.
    const second = document.querySelector('[data-path="when.any[1]"]') as HTMLElement;
    fireEvent.change(within(second).getByLabelText("Condition"), { target: { value: "seat" } });
    fireEvent.click(within(second).getByRole("button", { name: "occupied" }));
    fireEvent.change(within(second).getByLabelText("Test"), { target: { value: "not" } });
    expect(seen.at(-1)).toEqual({ any: [{ cond: "plug", in: ["inserted"] }, { not: { cond: "seat", in: ["occupied"] } }] });
  });

  it("keeps states in the condition's order and offers 'always'", () => {
    const seen: Predicate[] = [];
    render(<Harness initial={{ cond: "gear", in: [] }} seen={seen} />);
    fireEvent.click(screen.getByRole("button", { name: "reverse" }));
    fireEvent.click(screen.getByRole("button", { name: "forward" }));
    expect(seen.at(-1)).toEqual({ cond: "gear", in: ["forward", "reverse"] });
    fireEvent.change(screen.getByLabelText("Forbidden when"), { target: { value: "always" } });
    expect(seen.at(-1)).toEqual({ always: true });
  });
});
