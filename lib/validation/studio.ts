// Shared zod schemas for studios, members and invitations.
import { z } from "zod";
import { ROLES } from "@/lib/permissions";
import { email } from "./auth";

export const studioNameSchema = z.strictObject({ name: z.string().trim().min(1, "Name the studio.").max(120) });
export const roleSchema = z.enum(ROLES);
export const inviteSchema = z.strictObject({ email, role: roleSchema });
export const changeRoleSchema = z.strictObject({ role: roleSchema });
/** A UUID, in lower case whatever the spelling sent (ids are generated and stored in lower case). */
export const idParam = z.string().uuid("That is not a valid id.").transform((s) => s.toLowerCase());
export const studioParams = z.strictObject({ studioId: idParam });
export const memberParams = z.strictObject({ studioId: idParam, userId: idParam });
export const invitationParams = z.strictObject({ studioId: idParam, invitationId: idParam });
export const activityQuery = z.strictObject({
  before: z.coerce.number().int().positive().optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});
