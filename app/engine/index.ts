// Public API of the proof engine. Pure TypeScript: no React, no Node-only APIs.
export type {
  Design,
  Condition,
  Component,
  SupplyComponent,
  ContactComponent,
  JunctionComponent,
  InputComponent,
  InputFunction,
  Wire,
  Controller,
  ThrottleMapping,
  Lockout,
  Rule,
  InhibitRule,
  RequireDriveRule,
  NoRestartRule,
  Predicate,
  Verdict,
  RuleVerdict,
  InhibitVerdict,
  RequireDriveVerdict,
  NoRestartVerdict,
  SingleFault,
  FaultMode,
  Problem,
  RowStates,
} from "./schema";
export { designSchema, DESIGN_FORMAT, VERDICT_FORMAT, INPUT_FUNCTIONS, LOCKOUTS, RULE_TYPES, TERMINALS } from "./schema";
export {
  ENGINE_ROW_LIMIT,
  validateDesign,
  validateStoredDesign,
  formatPath,
  type ValidationResult,
  type StoredValidationResult,
} from "./validate";
export { compileDesign, type CompiledDesign, type ThrottleClass } from "./compile";
export { prove } from "./prove";
export {
  rowCount,
  decodeRow,
  encodeRow,
  rowProblems,
  evaluateRow,
  countRows,
  pageRows,
  findRow,
  filterRuleType,
  ROW_FILTERS,
  type RowFilter,
  type RowView,
  type ControllerState,
  type Direction,
} from "./rows";
export type { ContactFault } from "./table";
export { replayTrace, type StepView } from "./sequence";
export {
  evaluateRows,
  faultMeetings,
  faultRows,
  glimpseRows,
  stepInto,
  type ControllerMemory,
  type FaultMeetings,
  type RowGlimpse,
  type StepOutcome,
} from "./observe";
export { csvChunks, csvHeader, csvLine, textTableChunks } from "./csv";
export {
  diagnose,
  explainReadings,
  type Diagnosis,
  type InputDiagnosis,
  type DriveReason,
  type ContactToClose,
  type ReadingsExplanation,
} from "./diagnose";
export { smallestChange, MAX_CHANGES, type RestoreGoal, type ConditionChange, type SmallestChange } from "./restore";
export {
  groupRows,
  groupBits,
  whyRuleHolds,
  compareOutcomes,
  sameRowNumbering,
  parseRowSet,
  rowSetBits,
  brokenBits,
  RowSetError,
  GROUPS_FORMAT,
  WHY_FORMAT,
  BLOCKING_REASONS,
  type RowSet,
  type RowGroup,
  type GroupsDocument,
  type WhyDocument,
  type WhyPart,
  type BlockingReason,
  type OutcomeChange,
  type OutcomeChangeKind,
  type OutcomeComparison,
} from "./groups";
