// Public API of the controller settings record (chainproof/controller-record@1): pure TypeScript beside
// the engine; no React, no database, no Node APIs.
export {
  CONTROLLER_RECORD_FORMAT,
  CHEMISTRIES,
  SENSORS,
  DESCRIPTION_MAX,
  controllerRecordShape,
  controllerRecordSchema,
  validateRecord,
  orderProblems,
  recordLockouts,
  recordBrakeCutsDrive,
  type ControllerRecord,
  type Chemistry,
  type ThrottleSensor,
  type ThrottleSettings,
  type PrechargeSettings,
  type RecordValidation,
} from "./schema";
export {
  CELL_VOLTS,
  OPEN_SIGNAL_V,
  OPEN_GROUND_V,
  classifyReading,
  deriveThrottle,
  derivePrecharge,
  deriveValues,
  hasOpenGroundReading,
  type DerivedValues,
  type DerivedPrecharge,
  type DerivedThrottle,
  type ThrottleClassName,
} from "./derive";
export {
  FINDING_CODES,
  PRECHARGE_LEAST_FRACTION,
  designFindings,
  recordFindings,
  sortFindings,
  type Finding,
  type FindingCode,
  type Severity,
} from "./findings";
export { CONTROLLER_CHECK_FORMAT, checkRecord, parseRecord, hasErrors, type ControllerCheck, type ParsedRecord } from "./check";
export { roundHalfAway } from "./round";
export { FIELD_WORDS, CHEMISTRY_WORDS, SENSOR_WORDS, LOCKOUT_WORDS, CLASS_WORDS, type RecordField, type FieldWords } from "./words";
export {
  NUMBER_FIELDS,
  OPTIONAL_FIELDS,
  PRECHARGE_FIELDS,
  controllerFormSchema,
  formToRecord,
  recordToForm,
  lockoutField,
  type RecordForm,
} from "./form";
export { compareRecords, leaves, showValue, type RecordChange } from "./compare";
