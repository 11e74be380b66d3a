/**
 * `npm run bench [-- <name> …]`: runs bench/<name>.bench.ts (all of them when none is named).
 * Each benchmark measures its own baseline in the same run and prints ratios against it.
 */
import { readdirSync } from "node:fs";
import { fileURLToPath } from "node:url";

const here = fileURLToPath(new URL(".", import.meta.url));
const available = readdirSync(here)
  .filter((f) => f.endsWith(".bench.ts"))
  .map((f) => f.replace(/\.bench\.ts$/, ""))
  .sort();

const asked = process.argv.slice(2).filter((a) => !a.startsWith("-"));
const unknown = asked.filter((a) => !available.includes(a));
if (unknown.length > 0) {
  console.error(`unknown benchmark: ${unknown.join(", ")}; available: ${available.join(", ")}`);
  process.exit(2);
}
for (const name of asked.length > 0 ? asked : available) {
  console.log(`\n== bench ${name} ==`);
  const mod = (await import(`./${name}.bench.ts`)) as { main: (args: string[]) => Promise<void> };
  await mod.main(process.argv.slice(2).filter((a) => a.startsWith("-")));
}
