// Fresh component ids: short, readable, and never colliding with components or conditions.
import type { InputFunction } from "../engine";
import type { ComponentKind } from "./types";

export const ID_PREFIX: Record<ComponentKind, string> = { supply: "B", contact: "K", junction: "J", input: "IN" };
export const INPUT_ID: Record<InputFunction, string> = { power: "PWR", enable: "EN", forward: "FWD", reverse: "REV", brake: "BRK" };

export function freshId(base: string, taken: ReadonlySet<string>, numbered = true): string {
  if (!numbered && !taken.has(base)) return base;
  for (let n = 1; ; n++) {
    const id = `${base}${n}`;
    if (!taken.has(id)) return id;
  }
}
