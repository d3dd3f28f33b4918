// Prints the demo sign-ins (used by scripts/start.sh after the build, so they are the
// last thing on screen before the server's own output).
import { demoShop, demoUsers, DEMO_PASSWORD } from '../db/seed-data';

console.log(`Demo sign-ins for ${demoShop.name} (password for all: ${DEMO_PASSWORD}):`);
for (const u of demoUsers) console.log(`  ${u.role.padEnd(10)} ${u.email}`);
