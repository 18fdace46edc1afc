// One name per lockout, everywhere people read it: the editor, "why won't it drive", bench steps,
// the e-mail and the report (decision 137: the controller panel, the controller record, diagnosis and bench steps take their names from here). The name is the spec's id with "lockout", so what a
// person reads matches the design file and the command line.
import type { Lockout } from "../engine";

export const LOCKOUT_TEXT: Record<Lockout, { name: string; event: string; line: string; check: string }> = {
  "power-on": {
    name: "power-on lockout",
    event: "the controller powers up",
    line: "When the power input comes on, drive waits until the throttle has read released once.",
    check: "after switching on, drive waits for the throttle to be let go",
  },
  "enable-restore": {
    name: "enable-restore lockout",
    event: "the enable input comes back",
    line: "When the enable line comes back, drive waits for a released throttle.",
    check: "when the enable line comes back (seat, key, interlock), drive waits for the throttle to be let go",
  },
  "direction-engage": {
    name: "direction-engage lockout",
    event: "a direction is engaged",
    line: "Moving from neutral into forward or reverse holds drive off until the throttle is released.",
    check: "after choosing forward or reverse, drive waits for the throttle to be let go",
  },
  "brake-release": {
    name: "brake-release lockout",
    event: "the brake is released",
    line: "Letting the brake off holds drive off until the throttle is released.",
    check: "after the brake is let off, drive waits for the throttle to be let go",
  },
  "throttle-fault": {
    name: "throttle-fault lockout",
    event: "the throttle reads a fault",
    line: "A throttle fault reading latches drive off until the throttle reads released.",
    check: "after a throttle wiring fault, drive stays off until the throttle reads released",
  },
};

/** "Power-on lockout": the name as a title or at the start of a sentence. */
export function lockoutTitle(l: Lockout): string {
  const n = LOCKOUT_TEXT[l].name;
  return n[0].toUpperCase() + n.slice(1);
}

/** "power-on lockout" */
export function lockoutName(l: Lockout): string {
  return LOCKOUT_TEXT[l].name;
}
