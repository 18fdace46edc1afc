// Workspace roles and what each may do. Shared by the server (the authority) and the UI (what to show).
export const ROLES = ["admin", "engineer", "technician", "reviewer"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Admin",
  engineer: "Engineer",
  technician: "Technician",
  reviewer: "Reviewer",
};

export const ROLE_DUTIES: Record<Role, string> = {
  admin: "manage members and settings",
  engineer: "draw and edit designs",
  technician: "diagnose vehicles and run bench tests",
  reviewer: "review revisions and sign them off",
};

/** Who may do what; every loader and action asks through requireMember with one of these. */
export const CAN = {
  view: ROLES,
  manageMembers: ["admin"],
  editDesigns: ["engineer"],
  manageVehicles: ["admin", "engineer", "technician"],
  runBenchTests: ["technician"],
  // Putting an approved revision on a vehicle is an engineering decision (docs/decisions/070).
  releaseRevisions: ["admin", "engineer"],
  review: ["reviewer"],
  // Engineers explain how a defeating fault is dealt with; reviewers may record what they accept (decision 161).
  disposeFaults: ["engineer", "reviewer"],
  // The controller settings record: typed in at the vehicle by the people who set the controller up.
  recordControllerSettings: ["engineer", "technician"],
} as const satisfies Record<string, readonly Role[]>;
