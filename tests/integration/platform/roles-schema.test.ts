// The database's role columns hold the roles of lib/permissions.ts and nothing else. They stay MariaDB ENUMs: in
// strict mode (STRICT_TRANS_TABLES, MariaDB's default sql_mode since 10.2.4) an ENUM refuses a value outside its
// list, and ORDER BY sorts an ENUM by its list position (MariaDB Knowledge Base, "ENUM"), which listMembers relies
// on. Adding a role to ROLES fails this test until a migration (append-only, db/migrations) alters both columns.
import { afterAll, describe, expect, it } from "vitest";
import { db, closeDb } from "@/lib/server/db";
import { listMembers } from "@/lib/server/studios";
import { ROLES } from "@/lib/permissions";
import { makeStudioWithRoles, makeUser } from "../helpers";

afterAll(() => closeDb());

describe("role columns", () => {
  it("memberships.role, invitations.role and api_tokens.role are ENUMs of ROLES, in ROLES' order", async () => {
    const [rows] = await db().raw(
      "SELECT TABLE_NAME AS t, COLUMN_TYPE AS type, IS_NULLABLE AS nullable FROM information_schema.COLUMNS WHERE TABLE_SCHEMA = DATABASE() AND COLUMN_NAME = 'role' ORDER BY TABLE_NAME",
    );
    const want = `enum(${ROLES.map((r) => `'${r}'`).join(",")})`;
    expect(want).toBe("enum('owner','editor','viewer')");
    expect(rows).toEqual([
      { t: "api_tokens", type: want, nullable: "NO" },
      { t: "invitations", type: want, nullable: "NO" },
      { t: "memberships", type: want, nullable: "NO" },
    ]);
  });

  it("a role not in ROLES is refused by the database", async () => {
    const w = await makeStudioWithRoles();
    const someone = await makeUser();
    const err = await db()("memberships").insert({ studio_id: w.studio.id, user_id: someone.id, role: "guest" }).catch((e) => e);
    expect(err).toMatchObject({ errno: 1265 }); // ER_WARN_DATA_TRUNCATED, an error in strict mode
    expect(await db()("memberships").where({ studio_id: w.studio.id, user_id: someone.id }).first()).toBeUndefined();
  });

  it("members are listed by role in ROLES' order", async () => {
    const w = await makeStudioWithRoles();
    const roles = (await listMembers({ studioId: w.studio.id })).map((m) => m.role);
    expect(roles).toEqual([...ROLES]);
  });
});
