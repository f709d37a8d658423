// Prints the demo accounts (used by scripts/demo.sh).
import { DEMO_ACCOUNTS } from "./demo-accounts";

for (const a of DEMO_ACCOUNTS) process.stdout.write(`    ${a.role.padEnd(7)} ${a.email.padEnd(30)} ${a.password}\n`);
