// One colour table for the component kinds, so every drawing of a design (the editor's minimap, the
// review and report diagram) gives a supply and an input the same colours (decision 145). Colours are
// role tokens of app.css (--color-kind-*), written out in full here so Tailwind keeps them.
import type { TERMINALS } from "~/engine/vocabulary";

export type DrawnKind = keyof typeof TERMINALS;

export type KindColours = {
  /** The solid colour that identifies the kind at a glance (minimap, legend). */
  mark: string;
  /** Outline of the kind's box in a diagram. */
  stroke: string;
  /** Inside of the kind's box. */
  fill: string;
};

export const KIND_COLOURS: Record<DrawnKind, KindColours> = {
  // Where power enters the chain.
  supply: { mark: "var(--color-kind-supply)", stroke: "var(--color-kind-supply)", fill: "var(--color-kind-supply-soft)" },
  // What the chain powers: the controller's inputs.
  input: { mark: "var(--color-kind-input)", stroke: "var(--color-kind-input)", fill: "var(--color-kind-input-soft)" },
  // The switching in between.
  contact: { mark: "var(--color-kind-part)", stroke: "var(--color-kind-part-line)", fill: "var(--color-surface)" },
  junction: { mark: "var(--color-kind-part)", stroke: "var(--color-kind-part-line)", fill: "var(--color-kind-part-line)" },
};

/** The colours of a kind; an unknown kind (a malformed document) is drawn as a part. */
export function kindColours(kind: string | undefined): KindColours {
  return kind !== undefined && Object.hasOwn(KIND_COLOURS, kind) ? KIND_COLOURS[kind as DrawnKind] : KIND_COLOURS.contact;
}
