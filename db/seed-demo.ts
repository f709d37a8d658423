// The demo scenario: Harbour Lane Studio, an invented recording room, with an owner, an editor and a
// viewer. Idempotent: running it again leaves existing data alone.
//   node --conditions=react-server --import tsx db/seed-demo.ts
// The studio is made by the app's own service (lib/server/studios.ts: row, owner and activity in one
// transaction); accounts and the two other memberships by the factories shared with the tests (verified
// accounts with known passwords, members added without an invitation mail).
import { db, closeDb } from "../lib/server/db";
import { createStudio } from "../lib/server/studios";
import { createStroke } from "../lib/server/strokes";
import { findUserByEmail } from "../lib/server/auth/accounts";
import { addMember, createUser } from "./factories";
import { DEMO_ACCOUNTS, DEMO_STUDIO } from "./demo-accounts";
import { findDemoStudio } from "./demo-studio";

async function main() {
  if (await findDemoStudio()) {
    process.stdout.write(`demo seed: "${DEMO_STUDIO}" already there, left as it is\n`);
    return;
  }
  const users = [];
  for (const a of DEMO_ACCOUNTS) {
    const u = (await findUserByEmail(a.email)) ?? (await createUser(db(), { email: a.email, name: a.name, password: a.password }));
    users.push({ ...a, id: u.id });
  }
  const studio = await createStudio({ userId: users[0].id, name: DEMO_STUDIO });
  for (const u of users.slice(1)) await addMember(db(), { studioId: studio.id, userId: u.id, role: u.role });
  // two strokes of the studio's own (the Strokes page): what this room records beyond the built-in list
  await createStroke({ studioId: studio.id, actorId: users[0].id, input: { name: "Buzz rim shot", families: ["snare"], words: ["buzz rim", "buzzrim"], neighbours: [{ to: "rim-shot", cost: 0.5 }, { to: "buzz", cost: 1 }] } });
  await createStroke({ studioId: studio.id, actorId: users[0].id, input: { name: "Grab", families: ["crash", "ride", "china", "splash"], words: ["grab", "grabbed"], neighbours: [{ to: "choke", cost: 0.5 }] } });
  process.stdout.write(`demo seed: created "${DEMO_STUDIO}" with ${users.length} members\n`);
}

main()
  .catch((e) => {
    process.stderr.write(`demo seed failed: ${e instanceof Error ? e.message : String(e)}\n`);
    process.exitCode = 1;
  })
  .finally(() => closeDb());
