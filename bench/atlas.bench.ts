/**
 * Binary-projection atlas of all 256 ECAs: the search (lib/discovery) against plain enumeration of every
 * projection, the method of the first published searches (Israeli & Goldenfeld, PRL 92, 074105, 2004;
 * PRE 73, 026203, 2006), which stops at N = 4. Prints times, the speed-up at each N, and N = 5 by the search alone.
 */
import { buildEcaAtlas } from "@/lib/discovery";
import { ecaSupercell } from "@/lib/discovery/ca/supercell";

/** Plain enumeration: for each projection, derive the coarse rule from the windows and reject on the first clash. */
function plainAtlasRows(N: number): number {
  let rows = 0;
  for (let rule = 0; rule < 256; rule++) {
    const { n, out } = ecaSupercell(rule, N);
    const perTarget = new Map<number, number>();
    const g = new Int8Array(8);
    for (let p = 1; p < 2 ** n - 1; p++) {
      g.fill(-1);
      let ok = true;
      for (let a = 0; a < n && ok; a++) {
        for (let b = 0; b < n && ok; b++) {
          for (let c = 0; c < n; c++) {
            const idx = (((p >>> a) & 1) << 2) | (((p >>> b) & 1) << 1) | ((p >>> c) & 1);
            const v = (p >>> out[(a * n + b) * n + c]) & 1;
            if (g[idx] < 0) g[idx] = v;
            else if (g[idx] !== v) {
              ok = false;
              break;
            }
          }
        }
      }
      if (!ok) continue;
      let target = 0;
      for (let m = 0; m < 8; m++) target |= g[m] << m;
      perTarget.set(target, (perTarget.get(target) ?? 0) + 1);
    }
    rows += perTarget.size;
  }
  return rows;
}

/**
 * CPU seconds of this (single-threaded) process: the machine is shared, so wall time mixes in other work;
 * both sides of every ratio are measured the same way in the same run.
 */
function seconds(f: () => void): number {
  const t = process.cpuUsage();
  f();
  const d = process.cpuUsage(t);
  return (d.user + d.system) / 1e6;
}

export async function main(args: string[]): Promise<void> {
  const quick = args.includes("--quick");
  const maxPlain = quick ? 3 : 4;
  for (let N = 2; N <= maxPlain; N++) {
    let searchRows = 0;
    let plainRows = 0;
    // best of three runs for the search (it lasts a fraction of a second, so one run is mostly JIT warm-up and noise
    // from the shared machine); the plain enumeration runs once, for many seconds
    const search = Math.min(
      ...[0, 1, 2].map(() =>
        seconds(() => {
          searchRows = buildEcaAtlas({ kind: "projections", minBlock: N, maxBlock: N }).rows.length;
        }),
      ),
    );
    const plain = seconds(() => {
      plainRows = plainAtlasRows(N);
    });
    const agree = searchRows === plainRows ? "rows agree" : `ROWS DIFFER (${searchRows} vs ${plainRows})`;
    console.log(`atlas projections N=${N}: search ${search.toFixed(3)} s CPU (best of 3), plain enumeration ${plain.toFixed(3)} s CPU, speed-up ${(plain / search).toFixed(1)}x (${searchRows} rule/target rows, ${agree})`);
  }
  if (!quick) {
    let rows = 0;
    const t5 = seconds(() => {
      rows = buildEcaAtlas({ kind: "projections", minBlock: 5, maxBlock: 5 }).rows.length;
    });
    console.log(`atlas projections N=5: search ${t5.toFixed(1)} s CPU for all 256 rules (${rows} rule/target rows); plain enumeration would check 4.3e9 projections per rule`);
  }
  console.log(`peak memory (max RSS): ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB`);
}
