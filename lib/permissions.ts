// Roles as data (DEVELOPERS.md "Words"): the permission list, which role holds which, the studio rules that follow
// from them, and the words people read about them. Deny by default. Pure and shared: the server checks these,
// the UI reads them to hide what a role cannot do and to explain roles. The one source of roles: the database's
// role columns are checked against ROLES (tests/integration/platform/roles-schema.test.ts), db/factories.ts
// takes its Role type from here, and the prose of the invite form, the not-allowed notice, the studio overview
// and the invitation mail is made from ROLE_INFO and PERMISSION_INFO.

/** Every role, most powerful first. The `role` columns are ENUMs in this order (MariaDB sorts by it). */
export const ROLES = ["owner", "editor", "viewer"] as const;
export type Role = (typeof ROLES)[number];

export const PERMISSIONS = ["studio:read", "studio:write", "studio:manage", "members:manage", "activity:read"] as const;
export type Permission = (typeof PERMISSIONS)[number];

export const ROLE_PERMISSIONS: Record<Role, readonly Permission[]> = {
  owner: ["studio:read", "studio:write", "studio:manage", "members:manage", "activity:read"],
  editor: ["studio:read", "studio:write"],
  viewer: ["studio:read"],
};

/** What each permission allows: `summary` for sentences ("Viewers browse, ..."), `description` for lists. */
export const PERMISSION_INFO: Record<Permission, { summary: string; description: string }> = {
  "studio:read": { summary: "browse, listen and export", description: "view libraries, samples, kits, layouts and audits; listen; export" },
  "studio:write": { summary: "upload, label and edit kits and layouts", description: "upload, label and confirm samples; edit kits and layouts; run audits" },
  "studio:manage": { summary: "rename the studio and delete libraries", description: "rename the studio and delete libraries" },
  "members:manage": { summary: "manage members", description: "invite people, change roles, remove members" },
  "activity:read": { summary: "read the activity log", description: "read the activity log" },
};

/** How a role is named in sentences. */
export const ROLE_INFO: Record<Role, { article: "a" | "an"; plural: string }> = {
  owner: { article: "an", plural: "owners" },
  editor: { article: "an", plural: "editors" },
  viewer: { article: "a", plural: "viewers" },
};

/** The role a studio's creator gets. */
export const CREATOR_ROLE: Role = "owner";

/** The role the invite form offers first. */
export const DEFAULT_INVITE_ROLE: Role = "editor";

/**
 * A studio always keeps at least one member holding this permission (else nobody could invite anyone, change a
 * role or remove a member): the last such member can be neither given a role without it nor removed.
 */
export const KEPT_PERMISSION: Permission = "members:manage";

/** A role the code does not know (a row written by a newer version, say) grants nothing. */
export function can(role: Role | null | undefined, permission: Permission): boolean {
  return !!role && (ROLE_PERMISSIONS[role]?.includes(permission) ?? false);
}

export function isRole(s: unknown): s is Role {
  return typeof s === "string" && (ROLES as readonly string[]).includes(s);
}

/** Roles from the one holding the fewest permissions to the one holding the most (ties: as in ROLES). */
export function rolesByReach(): Role[] {
  return [...ROLES].sort((a, b) => ROLE_PERMISSIONS[a].length - ROLE_PERMISSIONS[b].length);
}

/** The roles holding a permission, fewest permissions first. */
export function rolesWith(permission: Permission): Role[] {
  return rolesByReach().filter((r) => can(r, permission));
}

/** "a viewer", "an editor". */
export function roleWithArticle(role: Role): string {
  return `${ROLE_INFO[role].article} ${role}`;
}

/** "a", "a and b", "a, b and c". */
export function listInWords(items: readonly string[], conjunction = "and"): string {
  if (items.length <= 1) return items.join("");
  return `${items.slice(0, -1).join(", ")} ${conjunction} ${items[items.length - 1]}`;
}

const capitalised = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** The plural names of the roles holding a permission: "owners", "Editors and owners". */
export function whoCan(permission: Permission, opts: { capital?: boolean } = {}): string {
  const words = listInWords(rolesWith(permission).map((r) => ROLE_INFO[r].plural));
  return opts.capital ? capitalised(words) : words;
}

/**
 * Every role in one sentence, from the least to the most reach; a role holding everything the one before it
 * holds is told by what it adds: "Viewers browse, listen and export; editors also upload, ...".
 */
export function rolesInWords(): string {
  let before: readonly Permission[] | null = null;
  const parts = rolesByReach().map((role, i) => {
    const mine = ROLE_PERMISSIONS[role];
    const adds = before !== null && before.every((p) => mine.includes(p));
    const told = adds ? mine.filter((p) => !before!.includes(p)) : mine;
    before = mine;
    const name = i === 0 ? capitalised(ROLE_INFO[role].plural) : ROLE_INFO[role].plural;
    if (adds && told.length === 0) return `${name} can do the same`;
    return `${name} ${adds ? "also " : ""}${listInWords(told.map((p) => PERMISSION_INFO[p].summary))}`;
  });
  return `${parts.join("; ")}.`;
}

/** True when every permission of `a` is also one of `b`'s (a role "at most" another). */
export function roleWithin(a: Role, b: Role): boolean {
  return ROLE_PERMISSIONS[a].every((p) => can(b, p));
}

/**
 * The most reaching role that holds nothing beyond either of two roles (a personal API token's role capped by its
 * creator's current one); null when no role fits within both, or when either is missing.
 */
export function cappedRole(a: Role | null | undefined, b: Role | null | undefined): Role | null {
  if (!a || !b) return null;
  const fits = rolesByReach().filter((r) => roleWithin(r, a) && roleWithin(r, b));
  return fits.length ? fits[fits.length - 1]! : null;
}
