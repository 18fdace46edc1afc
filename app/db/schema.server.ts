// One index of every table, split by domain.
export * from "./schema/auth.server";
export * from "./schema/workspace.server";
export * from "./schema/mail.server";
export * from "./schema/vehicle.server";
export * from "./schema/design.server";
export * from "./schema/upload.server";
export * from "./schema/api-key.server";
export * from "./schema/release.server";
export * from "./schema/bench-run.server";
export * from "./schema/review.server";
export * from "./schema/controller-record.server";
export * from "./schema/rate-limit.server";
