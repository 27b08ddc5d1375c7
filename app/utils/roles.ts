/** The roles a user may hold; a user may hold several. */
export const ROLES = ["admin", "planner", "approver", "rigger"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Admin",
  planner: "Planner",
  approver: "Appointed person",
  rigger: "Rigger",
};

export const ROLE_DUTIES: Record<Role, string> = {
  admin: "the organisation's users, roles and settings; records thorough examinations",
  planner: "builds components and lift plans, allocates gear, submits plans for review",
  approver: "reviews lift plans and approves or returns them with comments",
  rigger: "takes approved plans to the lift, completes the pre-lift checklist and records the lift",
};

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}

/** Whether a user (as seen by the client) holds any of `roles`. For display only, never for authorisation. */
export function hasAnyRole(user: { roles: readonly string[] } | null | undefined, ...roles: Role[]): boolean {
  return !!user && roles.some((r) => user.roles.includes(r));
}
