// The node-type registry: one module per component kind, each with its component, terminals and
// default data. `nodeTypes` is built once at module scope so xyflow never sees a new object.
import type { ComponentType } from "react";
import type { NodeProps, NodeTypes } from "@xyflow/react";
import type { InputFunction } from "../../engine";
import type { CanvasNode, ComponentKind, DesignRest } from "../types";
import { supplyKind } from "./supply";
import { contactKind } from "./contact";
import { junctionKind } from "./junction";
import { inputKind } from "./input";

export type NodeKind<K extends ComponentKind> = {
  kind: K;
  /** Palette name. */
  title: string;
  description: string;
  terminals: readonly string[];
  defaultData(ctx: { rest: DesignRest; fn?: InputFunction }): Extract<CanvasNode, { type: K }>["data"];
  component: ComponentType<NodeProps<Extract<CanvasNode, { type: K }>>>;
};

export const NODE_KINDS: { [K in ComponentKind]: NodeKind<K> } = {
  supply: supplyKind,
  contact: contactKind,
  junction: junctionKind,
  input: inputKind,
};

export const nodeTypes: NodeTypes = {
  supply: supplyKind.component,
  contact: contactKind.component,
  junction: junctionKind.component,
  input: inputKind.component,
} as NodeTypes;
