import { type RouteConfig, index, layout, prefix, route } from "@react-router/dev/routes";

export default [
  index("routes/home.tsx"),

  // Signing in and out; better-auth's own endpoints are mounted under /api/auth.
  route("sign-in", "routes/sign-in.tsx"),
  route("sign-up", "routes/sign-up.tsx"),
  route("sign-out", "routes/sign-out.tsx"),
  route("forgot-password", "routes/forgot-password.tsx"),
  route("reset-password", "routes/reset-password.tsx"),
  route("invite/:token", "routes/invite.tsx"),
  route("welcome", "routes/welcome.tsx"),
  route("outbox", "routes/outbox.tsx"),

  // Everything inside a workspace: its middleware finds the member once (docs/decisions/151).
  ...prefix("w/:ws", [
    layout("routes/workspace.ts", [
      // The shell and its sections.
      layout("routes/workspace-shell.tsx", [
        index("routes/workspace-home.tsx"),
        route("vehicles", "routes/vehicles.tsx"),
        route("vehicles/:vehicleId", "routes/vehicle.tsx"),
        route("vehicles/:vehicleId/why", "routes/vehicle-diagnose.tsx"),
        route("vehicles/:vehicleId/controller", "routes/vehicle-controller.tsx"),
        route("designs", "routes/designs.tsx"),
        route("designs/new", "routes/design-new.tsx"),
        route("designs/:designId", "routes/design.tsx"),
        route("designs/:designId/edit", "routes/design-editor.tsx"),
        route("designs/:designId/revisions/:number/table", "routes/revision-table.tsx"),
        route("designs/:designId/revisions/:number/review", "routes/review.tsx"),
        route("reviews", "routes/reviews.tsx"),
        route("activity", "routes/activity.tsx"),
        route("bench-tests", "routes/bench-tests.tsx"),
        route("bench-tests/:runId", "routes/bench-run.tsx"),
        route("bench-tests/:runId/results.csv", "routes/bench-run-csv.ts"),
        route("settings", "routes/settings.tsx"),
      ]),
      // The printable report of a revision and its PDF (outside the shell: paper, not screen).
      route("designs/:designId/revisions/:number/report", "routes/report.tsx"),
      route("designs/:designId/revisions/:number/report.pdf", "routes/report-pdf.ts"),
      // Uploaded files, for members of the workspace (outside the shell: a resource route).
      route("files/:uploadId", "routes/file.ts"),
    ]),
  ]),

  // Resource routes.
  route("api/auth/*", "routes/api/auth.ts"),
  route("healthz", "routes/api/healthz.ts"),
  route("api/v1/outbox", "routes/api/outbox.ts"),
  // The design API (JSON in, JSON out; docs/decisions/030).
  ...prefix("api/v1", [
    // Its middleware looks up the caller once (docs/decisions/151).
    layout("routes/api/v1/layout.ts", [
      route("designs", "routes/api/v1/designs.ts"),
      route("designs/:designId", "routes/api/v1/design.ts"),
      route("designs/:designId/draft", "routes/api/v1/design-draft.ts"),
      route("designs/:designId/revisions", "routes/api/v1/design-revisions.ts"),
      route("designs/:designId/revisions/:number", "routes/api/v1/design-revision.ts"),
      route("designs/:designId/revisions/:number/rows", "routes/api/v1/revision-rows.ts"),
      route("designs/:designId/revisions/:number/rows/:index", "routes/api/v1/revision-row.ts"),
      route("designs/:designId/revisions/:number/table.csv", "routes/api/v1/revision-table-csv.ts"),
      route("designs/:designId/revisions/:number/groups", "routes/api/v1/revision-groups.ts"),
      route("designs/:designId/revisions/:number/why", "routes/api/v1/revision-why.ts"),
      route("proofs", "routes/api/v1/proofs.ts"),
      route("designs/:designId/revisions/:number/diagnosis", "routes/api/v1/revision-diagnosis.ts"),
      route("vehicles", "routes/api/v1/vehicles.ts"),
      route("vehicles/:vehicleId", "routes/api/v1/vehicle.ts"),
      route("vehicles/:vehicleId/bench-runs", "routes/api/v1/vehicle-bench-runs.ts"),
      route("vehicles/:vehicleId/releases", "routes/api/v1/vehicle-releases.ts"),
      route("vehicles/:vehicleId/controller-record", "routes/api/v1/vehicle-controller-record.ts"),
      route("controller-checks", "routes/api/v1/controller-checks.ts"),
      route("bench-runs", "routes/api/v1/bench-runs.ts"),
      route("bench-runs/:runId", "routes/api/v1/bench-run.ts"),
      route("bench-runs/:runId/steps/:n", "routes/api/v1/bench-run-step.ts"),
      route("reviews", "routes/api/v1/reviews.ts"),
      route("openapi.json", "routes/api/v1/openapi.ts"),
    ]),
  ]),
  // The API description, readable (a page; public).
  route("api/v1/docs", "routes/api-docs.tsx"),
] satisfies RouteConfig;
