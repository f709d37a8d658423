// Requests and answers of /api/studios/:id/members(/:userId). Types only.
import type { z } from "zod";
import type { Role } from "@/lib/permissions";
import type { changeRoleSchema } from "@/lib/validation/studio";

export interface Member {
  userId: string;
  name: string;
  email: string;
  role: Role;
  since: string;
}

/** GET /api/studios/:id/members */
export interface MemberList {
  members: Member[];
}

/** PATCH /api/studios/:id/members/:userId */
export type ChangeRoleBody = z.input<typeof changeRoleSchema>;
export interface RoleChanged {
  userId: string;
  role: Role;
}
