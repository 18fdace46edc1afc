// The engine's fixed words and formats, with no dependencies: the editor's first paint imports
// these without loading the schema library that validation needs (schema.ts re-exports them).
export const DESIGN_FORMAT = "chainproof/design@1";
export const VERDICT_FORMAT = "chainproof/verdict@1";

export const INPUT_FUNCTIONS = ["power", "enable", "forward", "reverse", "brake"] as const;
export type InputFunction = (typeof INPUT_FUNCTIONS)[number];

export const LOCKOUTS = ["power-on", "enable-restore", "direction-engage", "brake-release", "throttle-fault"] as const;
export type Lockout = (typeof LOCKOUTS)[number];

export const ID_PATTERN = /^[A-Za-z0-9_.-]{1,64}$/;

/** Terminals each component type offers, in display order. */
export const TERMINALS = {
  supply: ["+"],
  contact: ["1", "2"],
  junction: ["j"],
  input: ["in"],
} as const;
