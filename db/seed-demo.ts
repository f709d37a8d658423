// The demo scenario: Harbour Lane Studio, an invented recording room, with an owner, an editor and a
// viewer. Idempotent: running it again leaves existing data alone. `node --import tsx db/seed-demo.ts`.
import knexFactory from "knex";
import config from "../knexfile";
import { addMember, createStudio, createUser } from "./factories";
import { DEMO_ACCOUNTS, DEMO_STUDIO } from "./demo-accounts";

async function main() {
  const k = knexFactory(config);
  try {
    const existing = await k("studios").where({ name: DEMO_STUDIO }).first();
    if (existing) {
      process.stdout.write(`demo seed: "${DEMO_STUDIO}" already there, left as it is\n`);
      return;
    }
    const users = [];
    for (const a of DEMO_ACCOUNTS) {
      const u = (await k("users").where({ email: a.email }).first()) ?? (await createUser(k, { email: a.email, name: a.name, password: a.password }));
      users.push({ ...a, id: u.id as string });
    }
    const studio = await createStudio(k, { name: DEMO_STUDIO, ownerId: users[0].id });
    for (const u of users.slice(1)) await addMember(k, { studioId: studio.id, userId: u.id, role: u.role });
    process.stdout.write(`demo seed: created "${DEMO_STUDIO}" with ${users.length} members\n`);
  } finally {
    await k.destroy();
  }
}

main().catch((e) => {
  process.stderr.write(`demo seed failed: ${e instanceof Error ? e.message : String(e)}\n`);
  process.exit(1);
});
