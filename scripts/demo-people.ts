import { DEMO_PEOPLE } from "@/db/seed/people";

// Printed by scripts/demo.sh under the URL.
for (const p of DEMO_PEOPLE) console.log(`    ${p.role.padEnd(12)} ${p.email.padEnd(30)} password: ${p.password}`);
