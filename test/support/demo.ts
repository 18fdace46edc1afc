// The demo accounts seeded by drizzle/seed.ts, as the tests know them.
export const DEMO_PASSWORD = "chainproof-demo";
export const DEMO = {
  admin: "admin@example.com",
  engineer: "engineer@example.com",
  technician: "technician@example.com",
  reviewer: "reviewer@example.com",
} as const;
export type DemoRole = keyof typeof DEMO;
