// The cautions people read wherever they act on what Chainproof computes: pages, the failure e-mail,
// the bench CSV and measuring advice share these words.
export const SAFETY_TEXT =
  "Chainproof helps you reason about interlock logic; it does not certify a vehicle. Isolate the traction battery before working on the wiring, verify every result on the vehicle itself, and follow local codes, standards and licensed practice.";

/** Said before any advice to measure or touch the wiring. */
export const ISOLATE_FIRST =
  "Isolate the traction pack first: open its disconnect, lock it off, and check with the meter that the controller's supply is dead.";
