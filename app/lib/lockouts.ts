// One name per lockout, everywhere people read it: the editor, "why won't it drive", bench steps,
// the e-mail and the report (decision 137). The name is the spec's id with "lockout", so what a
// person reads matches the design file and the command line.
import type { Lockout } from "../engine";

export const LOCKOUT_TEXT: Record<Lockout, { name: string; event: string; line: string }> = {
  "power-on": {
    name: "power-on lockout",
    event: "the controller powers up",
    line: "When the power input comes on, drive waits until the throttle has read released once.",
  },
  "enable-restore": {
    name: "enable-restore lockout",
    event: "the enable input comes back",
    line: "When the enable line comes back, drive waits for a released throttle.",
  },
  "direction-engage": {
    name: "direction-engage lockout",
    event: "a direction is engaged",
    line: "Moving from neutral into forward or reverse holds drive off until the throttle is released.",
  },
  "brake-release": {
    name: "brake-release lockout",
    event: "the brake is released",
    line: "Letting the brake off holds drive off until the throttle is released.",
  },
  "throttle-fault": {
    name: "throttle-fault lockout",
    event: "the throttle reads a fault",
    line: "A throttle fault reading latches drive off until the throttle reads released.",
  },
};

/** "power-on lockout" */
export function lockoutName(l: Lockout): string {
  return LOCKOUT_TEXT[l].name;
}
