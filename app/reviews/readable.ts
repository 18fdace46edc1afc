// The shape of what a reviewer reads about a revision (computed in readable.server.ts); no server imports.
import type { GroupsDocument, WhyDocument } from "~/engine";

export type RuleReading =
  | {
      type: "inhibit";
      id: string;
      label: string;
      forbids: string;
      holds: boolean;
      unsafe: GroupsDocument;
      violating: GroupsDocument;
      why: WhyDocument | null;
    }
  | { type: "require-drive"; id: string; label: string; holds: boolean; demand: GroupsDocument; failing: GroupsDocument }
  | { type: "no-restart"; id: string; label: string; holds: boolean };

export type FaultReading = { component: string; label: string; mode: string; defeats: string[]; broken: GroupsDocument };

export type Readable = {
  rows: number;
  conditions: Array<{ id: string; label: string; states: string[] }>;
  drive: GroupsDocument;
  rules: RuleReading[];
  faults: FaultReading[];
  /** Groups shown per set; groupCount tells how many a set has. */
  limit: number;
};
