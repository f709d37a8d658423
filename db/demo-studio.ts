// The demo studio and its owner as the app knows them (lib/server services, configuration from env.ts), for
// the seeds. Run under `node --conditions=react-server --import tsx` (server-only modules).
import { findUserByEmail } from "../lib/server/auth/accounts";
import { listStudiosForUser } from "../lib/server/studios";
import { CREATOR_ROLE } from "../lib/permissions";
import { DEMO_ACCOUNTS, DEMO_STUDIO } from "./demo-accounts";

/** The demo studio (found through its owner's studios) and the owner's id, or null when not seeded yet. */
export async function findDemoStudio(): Promise<{ studioId: string; ownerId: string } | null> {
  const owner = await findUserByEmail(DEMO_ACCOUNTS[0].email);
  if (!owner) return null;
  const studio = (await listStudiosForUser(owner.id)).find((s) => s.name === DEMO_STUDIO && s.role === CREATOR_ROLE);
  return studio ? { studioId: studio.id, ownerId: owner.id } : null;
}
