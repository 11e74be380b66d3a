/**
 * The smallest-block table (proper partitions) of all 256 ECAs extended to N = 9 (2^27 windows per supercell table),
 * against the same sweep to N = 8 measured first in the same run. Reports wall and CPU time, peak memory, and what
 * happens at N = 9 to the classes without a proper coarse-graining up to N = 8. `--quick`: N = 6 against N = 5.
 * The machine is shared: run it niced (`nice -n 10 npm run bench -- partitions-n9`).
 */
import { smallestBlockHeadline } from "@/cli/commands/atlas";
import { buildEcaAtlas, type PartitionAtlasRow } from "@/lib/discovery";

function timed<T>(f: () => T): [T, number, number] {
  const t = process.cpuUsage();
  const w = performance.now();
  const result = f();
  const d = process.cpuUsage(t);
  return [result, (d.user + d.system) / 1e6, (performance.now() - w) / 1000];
}

function noneClasses(rows: PartitionAtlasRow[]): number[] {
  return [...new Set(rows.filter((r) => r.block === null).map((r) => r.symmetryClass))].sort((a, b) => a - b);
}

export async function main(args: string[]): Promise<void> {
  const top = args.includes("--quick") ? 6 : 9;
  const [before, beforeCpu, beforeWall] = timed(() => buildEcaAtlas({ kind: "partitions", maxBlock: top - 1 }));
  const [after, afterCpu, afterWall] = timed(() => buildEcaAtlas({ kind: "partitions", maxBlock: top }));
  const rowsBefore = before.rows as PartitionAtlasRow[];
  const rows = after.rows as PartitionAtlasRow[];
  const firstAtTop = rows.filter((r) => r.block === top).length;
  console.log(
    `partitions sweep N=2..${top}, all 256 rules: ${afterCpu.toFixed(1)} s CPU, ${afterWall.toFixed(1)} s wall; baseline N=2..${top - 1} in the same run ${beforeCpu.toFixed(1)} s CPU, ${beforeWall.toFixed(1)} s wall; ratio ${(afterCpu / beforeCpu).toFixed(1)}x CPU; peak memory (max RSS) ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB${top === 9 ? " (targets < 30 min, < 8 GB)" : ""}`,
  );
  console.log(smallestBlockHeadline(rows, top));
  console.log(
    `first coarse-graining at N=${top}: ${firstAtTop} rules; classes with none up to N=${top - 1}: ${noneClasses(rowsBefore).join(", ")}; with none up to N=${top}: ${noneClasses(rows).join(", ") || "none"}`,
  );
}
