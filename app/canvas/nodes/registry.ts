// The node-type registry: each component kind's view, built once at module scope so xyflow never
// sees a new object. What a kind is (terminals, default data, size, names) lives in
// ../node-kinds.ts, which imports no React and nothing of the store.
import type { NodeTypes } from "@xyflow/react";
import { ContactNodeView } from "./contact";
import { InputNodeView } from "./input";
import { JunctionNodeView } from "./junction";
import { SupplyNodeView } from "./supply";

export const nodeTypes: NodeTypes = {
  supply: SupplyNodeView,
  contact: ContactNodeView,
  junction: JunctionNodeView,
  input: InputNodeView,
} as NodeTypes;
