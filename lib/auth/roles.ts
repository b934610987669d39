/**
 * Roles and what each may do. Ranks are cumulative: a steward can do what a member can, an admin
 * what a steward can. Every server action and route handler checks these itself.
 */
export const ROLES = ["member", "steward", "admin"] as const;
export type Role = (typeof ROLES)[number];

const RANK: Record<Role, number> = { member: 1, steward: 2, admin: 3 };

export function hasRole(actual: Role, required: Role): boolean {
  return RANK[actual] >= RANK[required];
}

export const ROLE_DESCRIPTIONS: Record<Role, string> = {
  member: "logs sweeps, run sessions and failures",
  steward: "also manages coils and parts, decides clearances and manages loans",
  admin: "also manages user accounts and the clearance policy",
};

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}
