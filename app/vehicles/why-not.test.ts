// "Why won't it drive?" on the demo hauler design: the checklist's facts come from the engine.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { compileDesign, type Design } from "../engine";
import { explainMeasured, restingStates, whyNot } from "./why-not";

const hauler = compileDesign(
  JSON.parse(readFileSync(new URL("../../drizzle/demo-designs/haybarn-campus-hauler.json", import.meta.url), "utf8")) as Design,
);
const ready = { key: "on", seat: "occupied", plug: "free", park: "released", lever: "forward", brake: "up", pedal: "down" };

describe("whyNot", () => {
  it("drives with every condition right, and names nothing", () => {
    const r = whyNot(hauler, ready);
    expect(r.drive).toBe(true);
    expect(r.blockers).toEqual([]);
  });

  it("names the seat contact, its terminals and the state that closes it when the seat is empty", () => {
    const r = whyNot(hauler, { ...ready, seat: "empty" });
    expect(r.drive).toBe(false);
    expect(r.blockers.map((b) => b.code)).toEqual(["not-enabled"]);
    const [set] = r.blockers[0].contactSets;
    expect(set.map((k) => k.contact)).toEqual(["SEAT"]);
    expect(set[0]).toMatchObject({ want: "close", targetStates: ["occupied"], state: "empty" });
    expect(set[0].terminals.map((t) => t.terminal)).toEqual(["SEAT.1", "SEAT.2"]);
    expect(set[0].terminals[1].to[0]).toContain("INLET.1");
  });

  it("lists power first, and the smallest set when several contacts must close together", () => {
    const r = whyNot(hauler, { ...ready, key: "off", seat: "empty" });
    expect(r.blockers[0].code).toBe("unpowered");
    const enable = r.blockers.find((b) => b.code === "not-enabled")!;
    expect(enable.contactSets.map((s) => s.map((k) => k.contact).sort())).toEqual([["KEY", "SEAT"]]);
  });

  it("names the closed brake-pedal switch as what feeds a live brake input", () => {
    const r = whyNot(hauler, { ...ready, brake: "pressed" });
    const braking = r.blockers.find((b) => b.code === "braking")!;
    expect(braking.contactSets.flat().map((k) => k.contact)).toEqual(["BRK"]);
    expect(braking.contactSets[0][0]).toMatchObject({ want: "open", targetStates: ["up"] });
  });

  it("follows the order of taps: switching on with the pedal held latches a lockout, cleared by returning the pedal", () => {
    const history = [{ ...ready, key: "off" }];
    const held = whyNot(hauler, ready, history);
    expect(held.drive).toBe(false);
    expect(held.steadyDrive).toBe(true);
    const lockout = held.blockers.find((b) => b.code === "lockout-latched")!;
    expect(lockout.title).toContain("power-on lockout");
    expect(lockout.advice).toContain("Return Accelerator pedal to up");
    const after = whyNot(hauler, ready, [...history, ready, { ...ready, pedal: "up" }]);
    expect(after.drive).toBe(true);
  });

  it("starts from rest: throttle released", () => {
    expect(restingStates(hauler).pedal).toBe("up");
  });
});

describe("explainMeasured", () => {
  it("names the seat switch stuck closed when enable reads live with the seat empty", () => {
    const v = explainMeasured(hauler, { ...ready, seat: "empty" }, { EN: true });
    expect(v.kind).toBe("faults");
    if (v.kind !== "faults") return;
    expect(v.mismatched).toEqual(["EN"]);
    expect(v.suspects[0]).toMatchObject({ contact: "SEAT", mode: "stuck-closed" });
    // Measuring continuity is done on a dead circuit: the advice starts by isolating the traction pack.
    for (const s of v.suspects) expect(s.check).toMatch(/^Isolate the traction pack first: .*Then, with .* measure across its terminals/);
  });

  it("says the readings match when they do, and nothing without readings", () => {
    expect(explainMeasured(hauler, ready, { EN: true, PWR: true }).kind).toBe("consistent");
    expect(explainMeasured(hauler, ready, {}).kind).toBe("none");
  });

  it("says no single stuck contact explains a reading no one contact can cause", () => {
    // Brake live with the key off: only the key contact and the brake switch together could do it.
    const v = explainMeasured(hauler, { ...ready, key: "off" }, { BRAKE: true });
    expect(v.kind).toBe("unexplained");
  });
});
