// The bench plan document: what the generator returns, what a bench run freezes, what the command
// line prints (`chainproof bench-plan`), and what the property test replays.

export type BenchExpect = {
  drive: boolean;
  /** Input id -> energized (live). */
  inputs: Record<string, boolean>;
  /** The lockout latch after this step (always present in plans made since decision 130). */
  latched?: boolean;
};

/** One condition set to one state; the moves of a step are made in the order listed. */
export type BenchMove = { condition: string; from: string; to: string };

export type BenchStep = {
  /** 1 for the first step. */
  n: number;
  /** "row": shows a row of the truth table; "sequence": checks a lockout (decision 132). */
  kind: "row" | "sequence";
  /**
   * The moves from the previous step's conditions to this step's, in order; each is one step of
   * spec 1.5, and `expect` is what replaying them gives. Absent in plans frozen before decision 130.
   */
  moves?: BenchMove[];
  /** Moves that may be made in any order without changing the outcome: [from, to) indexes into `moves`. */
  anyOrder?: [number, number];
  /** Every condition's state at the end of this step. */
  set: Record<string, string>;
  expect: BenchExpect;
  /** Items this step checks: "rule:ID", "lockout:NAME". */
  covers: string[];
  /** Faults ("fault:CONTACT:stuck-open") whose drive, inputs or latch would differ from `expect` here. */
  reveals?: string[];
  instruction: string;
  caution?: string;
};

export type BenchPlan = {
  format?: "chainproof/bench-plan@1";
  design: string;
  /** The rest row the procedure starts from: no drive, throttle released, fewest live inputs. */
  start: { set: Record<string, string>; expect: BenchExpect; instruction: string };
  steps: BenchStep[];
  /** Items no step checks, each with the reason: "rule:ID", "lockout:NAME", "fault:CONTACT:MODE". */
  uncovered: Array<{ item: string; reason: string }>;
  stats: {
    steps: number;
    /** Steps checking a lockout. */
    lockoutSteps?: number;
    /** Moves (condition changes) from the start row to the last step. */
    conditionChanges: number;
    /** Items to cover: inhibit and require-drive rules + 2 faults per contact + listed lockouts. */
    items: number;
    covered: number;
    /** Single stuck contacts: all, those some row reveals, those this plan reveals. */
    faults?: { total: number; revealable: number; revealed: number };
    /**
     * No plan can reveal every revealable fault and show a test row for each rule with fewer rows.
     * A table searched whole: the fewest such rows, `exact` when proven minimal. A sampled table: a
     * bound over the whole table from faults no row shows together (`apart`), and beside it the
     * fewest rows among those searched (`searched`; not a bound). `planRows`: distinct rows this plan observes.
     */
    lowerBound?: {
      rows: number;
      exact: boolean;
      /** The same when one of the rows must also show drive (lockout checks need one). */
      rowsWithDrive?: number;
      exactWithDrive?: boolean;
      planRows: number;
      /** Sampled tables: the faults no row shows two of ("drive-row": the need for a row that drives). */
      apart?: { faults: string[]; withDrive?: string[] };
      /** Sampled tables: rows searched, and the fewest of them that meet every need. */
      searched?: { rows: number; fewest: number; fewestWithDrive?: number };
    };
    /** Rows of the truth table, and how many of them the search looked at. */
    rows: number;
    rowsSearched: number;
    /** Plans frozen before decision 130: one-item-at-a-time plan size. */
    naiveSteps?: number;
  };
};
