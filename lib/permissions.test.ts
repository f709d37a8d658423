// Roles as data: the roles table of DEVELOPERS.md "Words" (our own rule, no published source) and the words derived
// from it. Every expected sentence below is written out by hand from that table.
import { describe, expect, it } from "vitest";
import { can, cappedRole, isRole, roleWithin, KEPT_PERMISSION, listInWords, PERMISSIONS, ROLES, ROLE_PERMISSIONS, roleWithArticle, rolesByReach, rolesInWords, rolesWith, whoCan, CREATOR_ROLE } from "./permissions";

describe("roles as data", () => {
  it("holds the roles table: viewers read, editors also write, owners also manage (deny by default)", () => {
    expect(ROLES.filter((r) => can(r, "studio:read"))).toEqual(["owner", "editor", "viewer"]);
    expect(ROLES.filter((r) => can(r, "studio:write"))).toEqual(["owner", "editor"]);
    expect(ROLES.filter((r) => can(r, "studio:manage"))).toEqual(["owner"]);
    expect(ROLES.filter((r) => can(r, "members:manage"))).toEqual(["owner"]);
    expect(can(null, "studio:read")).toBe(false);
    expect(can("guest" as never, "studio:read")).toBe(false); // a role the code does not know grants nothing
    expect(isRole("viewer")).toBe(true);
    expect(isRole("Viewer")).toBe(false);
    for (const r of ROLES) for (const p of ROLE_PERMISSIONS[r]) expect(PERMISSIONS).toContain(p);
  });

  it("the creator's role can manage members, so a new studio keeps the permission it must keep", () => {
    expect(can(CREATOR_ROLE, KEPT_PERMISSION)).toBe(true);
    expect(rolesWith(KEPT_PERMISSION)).toEqual(["owner"]);
  });

  it("tells roles in words, from the least reach to the most", () => {
    expect(rolesByReach()).toEqual(["viewer", "editor", "owner"]);
    expect(rolesInWords()).toBe(
      "Viewers browse, listen and export; editors also upload, label and edit kits and layouts; " +
        "owners also rename the studio and delete libraries, manage members and read the activity log.",
    );
    expect(whoCan("studio:write", { capital: true })).toBe("Editors and owners");
    expect(whoCan("activity:read")).toBe("owners");
    expect(whoCan("studio:read")).toBe("viewers, editors and owners");
    expect(ROLES.map(roleWithArticle)).toEqual(["an owner", "an editor", "a viewer"]);
    expect(listInWords([])).toBe("");
    expect(listInWords(["a", "b"], "or")).toBe("a or b");
  });

  it("caps a token's role by its creator's: never more than either (DESIGN.md's table, written out by hand)", () => {
    expect(roleWithin("viewer", "editor")).toBe(true);
    expect(roleWithin("editor", "viewer")).toBe(false);
    expect(roleWithin("owner", "owner")).toBe(true);
    expect(cappedRole("owner", "editor")).toBe("editor");
    expect(cappedRole("editor", "owner")).toBe("editor");
    expect(cappedRole("editor", "viewer")).toBe("viewer");
    expect(cappedRole("viewer", "owner")).toBe("viewer");
    expect(cappedRole("owner", "owner")).toBe("owner");
    expect(cappedRole("editor", null)).toBe(null);
    expect(cappedRole(undefined, "owner")).toBe(null);
  });
});
