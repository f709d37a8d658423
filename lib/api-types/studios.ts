// Requests and answers of the studio routes (/api/studios, /api/studios/:id) and the studio's home page in
// numbers. Types only, shared by lib/server and components/data.
import type { z } from "zod";
import type { Role } from "@/lib/permissions";
import type { studioNameSchema } from "@/lib/validation/studio";

/** A studio I belong to, with my role (GET /api/studios: { studios }). */
export interface StudioSummary {
  id: string;
  name: string;
  role: Role;
}

/** GET /api/studios/:id */
export interface StudioInfo {
  id: string;
  name: string;
  createdAt: string;
  role: Role;
}

/** POST /api/studios and PATCH /api/studios/:id */
export type StudioNameBody = z.input<typeof studioNameSchema>;
export interface CreatedStudio {
  id: string;
}
export interface RenamedStudio {
  id: string;
  name: string;
}

/** The studio's home page: libraries with their sample states, kits, layouts and the latest audits. */
export interface StudioOverview {
  libraries: { id: string; name: string; total: number; catalogued: number; pending: number; rejected: number }[];
  kits: number;
  layouts: number;
  audits: { id: string; layoutName: string; kitName: string; score: number; silentPads: number; createdAt: string }[];
}
