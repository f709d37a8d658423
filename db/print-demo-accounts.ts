// Prints the demo accounts (used by scripts/demo.sh); with --owner-email, only the owner's address.
import { DEMO_ACCOUNTS } from "./demo-accounts";

if (process.argv.includes("--owner-email")) process.stdout.write(`${DEMO_ACCOUNTS.find((a) => a.role === "owner")!.email}\n`);
else for (const a of DEMO_ACCOUNTS) process.stdout.write(`    ${a.role.padEnd(7)} ${a.email.padEnd(30)} ${a.password}\n`);
