// Roles as data (DESIGN.md "Roles"): the permission list and which role holds which. Deny by default.
// Pure and shared: the server checks these, the UI reads them to hide what a role cannot do.

export const ROLES = ["owner", "editor", "viewer"] as const;
export type Role = (typeof ROLES)[number];

export const PERMISSIONS = [
  "studio:read", // view libraries, samples, kits, layouts, audits; listen; export
  "studio:write", // upload, label, confirm, edit kits and layouts, run audits
  "studio:manage", // rename the studio, delete libraries
  "members:manage", // invite, change roles, revoke invitations, remove members
  "activity:read", // see the studio's activity log
] as const;
export type Permission = (typeof PERMISSIONS)[number];

export const ROLE_PERMISSIONS: Record<Role, readonly Permission[]> = {
  owner: ["studio:read", "studio:write", "studio:manage", "members:manage", "activity:read"],
  editor: ["studio:read", "studio:write"],
  viewer: ["studio:read"],
};

export function can(role: Role | null | undefined, permission: Permission): boolean {
  return !!role && ROLE_PERMISSIONS[role].includes(permission);
}

export function isRole(s: unknown): s is Role {
  return typeof s === "string" && (ROLES as readonly string[]).includes(s);
}
