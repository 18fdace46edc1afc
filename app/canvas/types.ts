// Canvas-side shapes: one typed `data` per node kind (a union), and the non-graph part of a design.
import type { Edge, Node } from "@xyflow/react";
import type { Condition, Controller, InputFunction, Rule } from "../engine";

export type SupplyData = { label?: string };
export type ContactData = { label?: string; condition: string; closedIn: string[]; part?: string };
export type JunctionData = { label?: string };
export type InputData = { label?: string; function: InputFunction };

export type SupplyNode = Node<SupplyData, "supply">;
export type ContactNode = Node<ContactData, "contact">;
export type JunctionNode = Node<JunctionData, "junction">;
export type InputNode = Node<InputData, "input">;
export type CanvasNode = SupplyNode | ContactNode | JunctionNode | InputNode;
export type ComponentKind = CanvasNode["type"];

/** A wire: source/sourceHandle is the spec's `from`, target/targetHandle its `to`. */
export type CanvasEdge = Edge<Record<string, never>, "wire">;

/** Everything in a design document except components, wires and layout. */
export type DesignRest = {
  format: string;
  name: string;
  conditions: Condition[];
  controller: Controller;
  rules: Rule[];
  /** Unknown top-level keys, kept so a round trip loses nothing. */
  extra: Record<string, unknown>;
};

export type XY = { x: number; y: number };
