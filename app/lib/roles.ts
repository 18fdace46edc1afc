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

/**
 * Who may do what: one table, read through can(). Every loader and action states the action it
 * needs (requireCan in app/auth/context.server.ts); pages ask can() what to show.
 */
export const PERMISSIONS = {
  "workspace.view": ROLES,
  "members.manage": ["admin"],
  // Create designs, save drafts, save revisions.
  "design.edit": ["engineer"],
  // Archive a design or bring it back: kept for audit, hidden from lists (decision 167).
  "design.archive": ["admin", "engineer"],
  "vehicle.manage": ["admin", "engineer", "technician"],
  "bench.run": ["technician"],
  // Putting an approved revision on a vehicle is an engineering decision (docs/decisions/070).
  "revision.release": ["admin", "engineer"],
  "review.decide": ["reviewer"],
  // The workspace's design events in words: those who draw, sign off or run the workspace (decision 164).
  "design-events.read": ["admin", "engineer", "reviewer"],
  // Engineers explain how a defeating fault is dealt with; reviewers may record what they accept (decision 161).
  "fault.dispose": ["engineer", "reviewer"],
  // The controller settings record: typed in at the vehicle by the people who set the controller up.
  "controller.record": ["engineer", "technician"],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof PERMISSIONS;

/** Whether a member with this role may do this. */
export function can(role: Role, action: Action): boolean {
  return (PERMISSIONS[action] as readonly Role[]).includes(role);
}

/** The roles that may do this, for messages ("This needs the role engineer"). */
export function rolesThatCan(action: Action): readonly Role[] {
  return PERMISSIONS[action];
}
