// Canvas-side shapes: one typed `data` per node kind (a union), and the non-graph part of a design.
import type { Edge, Node } from "@xyflow/react";
import type { Condition, ContactFault, Controller, InputFunction, RowStates, Rule } from "../engine";

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

/** What the canvas shows in simulation: one row (by hand, from a counterexample, or a step of a trace). */
export type SimSource =
  | { kind: "hand" }
  | { kind: "row"; index: number }
  | { kind: "example"; ruleId: string }
  | { kind: "fault"; ruleId: string; fault: ContactFault }
  | { kind: "trace"; ruleId: string; rows: RowStates[]; step: number };
export type Simulation = { states: RowStates; source: SimSource };

/** The evaluated row the nodes and wires draw from (computed by the simulation driver). */
export type SimView = {
  contacts: Record<string, boolean>;
  inputs: Record<string, boolean>;
  energized: ReadonlySet<string>;
  drive: boolean;
  latched?: boolean;
  armed?: string[];
  /** The contact held stuck in the fault view. */
  fault?: ContactFault;
  error?: string;
};
