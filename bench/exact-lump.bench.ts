/**
 * Coarsest exact lumping (Buchholz 1994): splitter refinement on the transposed chain (lib/discovery).
 *  1. 100,000 states / ~1,000,000 transitions: exact against ordinary (strong) lumping of the same chain, same run.
 *  2. 1,000,000 states / 10,000,000 transitions: the command users run (`lump FILE --exact --json` on a Matrix
 *     Market file), wall time and peak memory of that process, against ordinary lumping of the same file in the
 *     same run.
 * The chains are permutation mixtures (lib/discovery/markov/permutationMixture.ts), 1000 groups.
 */
import { execFileSync } from "node:child_process";
import { closeSync, mkdtempSync, openSync, rmSync, writeSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { coarsestLumping, permutationMixture, type SparseChain } from "@/lib/discovery";

function writeMatrixMarket(path: string, chain: SparseChain): void {
  const fd = openSync(path, "w");
  writeSync(fd, `%%MatrixMarket matrix coordinate real general\n${chain.size} ${chain.size} ${chain.col.length}\n`);
  let buffer: string[] = [];
  for (let i = 0; i < chain.size; i++) {
    for (let e = chain.rowStart[i]; e < chain.rowStart[i + 1]; e++) buffer.push(`${i + 1} ${chain.col[e] + 1} ${chain.value[e].num}/${chain.value[e].den}`);
    if (buffer.length > 200_000) {
      writeSync(fd, `${buffer.join("\n")}\n`);
      buffer = [];
    }
  }
  if (buffer.length > 0) writeSync(fd, `${buffer.join("\n")}\n`);
  closeSync(fd);
}

function seconds<T>(f: () => T): [T, number, number] {
  const t = process.cpuUsage();
  const w = performance.now();
  const result = f();
  const d = process.cpuUsage(t);
  return [result, (d.user + d.system) / 1e6, (performance.now() - w) / 1000];
}

/** Runs the CLI as users do, under /usr/bin/time -v: wall and CPU seconds, peak RSS in MB, and its stdout. */
function timedCliWithStats(args: string[]): { wall: number; cpu: number; rssMb: number; stdout: string } {
  const dir = mkdtempSync(join(tmpdir(), "squarely-bench-"));
  const statsFile = join(dir, "time.txt");
  try {
    const wall = performance.now();
    const stdout = execFileSync("/usr/bin/time", ["-v", "-o", statsFile, "npx", "tsx", "cli/index.ts", ...args], { encoding: "utf8", maxBuffer: 1 << 30 });
    const elapsed = (performance.now() - wall) / 1000;
    const stats = execFileSync("cat", [statsFile], { encoding: "utf8" });
    const user = Number(/User time \(seconds\): ([\d.]+)/.exec(stats)?.[1]);
    const sys = Number(/System time \(seconds\): ([\d.]+)/.exec(stats)?.[1]);
    const rss = Number(/Maximum resident set size \(kbytes\): (\d+)/.exec(stats)?.[1]);
    return { wall: elapsed, cpu: user + sys, rssMb: rss / 1024, stdout };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/**
 * Exact against ordinary lumping of one chain, each the median of `runs` counted runs taken in turn after an
 * untimed run of each (a single run's ratio swung from 1.6x to 2.1x with the garbage collector's threads, which
 * process CPU time includes); returns the exact lumping's median wall time.
 */
function compareInProcess(name: string, chain: SparseChain, members: number, runs: number): number {
  const labels = Array.from({ length: chain.size }, (_, i) => (i < members ? "watched" : "other"));
  // one untimed run of each first, so that neither pays the JIT's warm-up inside the comparison
  coarsestLumping({ chain, labels });
  coarsestLumping({ chain, labels, exact: true });
  const strongCpu: number[] = [];
  const exactCpu: number[] = [];
  const exactWall: number[] = [];
  let blocks = { strong: 0, exact: 0 };
  for (let i = 0; i < runs; i++) {
    const [strong, sCpu] = seconds(() => coarsestLumping({ chain, labels }));
    const [exact, eCpu, eWall] = seconds(() => coarsestLumping({ chain, labels, exact: true }));
    strongCpu.push(sCpu);
    exactCpu.push(eCpu);
    exactWall.push(eWall);
    blocks = { strong: strong.blocks, exact: exact.blocks };
  }
  const [e, s] = [median(exactCpu), median(strongCpu)];
  console.log(
    `exact lumping ${name} / ${chain.col.length} transitions, one group apart (median of ${runs} runs of each, taken in turn after a warm-up run of each): ${e.toFixed(2)} s CPU (${median(exactWall).toFixed(2)} s wall); ordinary lumping of the same chain ${s.toFixed(2)} s CPU; ratio ${(e / s).toFixed(2)}x (target ≤ 2x); ${blocks.exact} exact blocks, ${blocks.strong} strong blocks`,
  );
  return median(exactWall);
}

export async function main(args: string[]): Promise<void> {
  const quick = args.includes("--quick");
  compareInProcess("100,000 states", permutationMixture({ groups: 1000, members: 100, seed: 7 }), 100, 5);
  if (quick) return;
  const dir = mkdtempSync(join(tmpdir(), "squarely-exact-"));
  try {
    const [big, buildCpu] = seconds(() => permutationMixture({ groups: 1000, members: 1000, seed: 11 }));
    const inProcessWall = compareInProcess("1,000,000 states", big, 1000, 3);
    const file = join(dir, "mixture.mtx");
    writeMatrixMarket(file, big);
    console.log(`built the 1,000,000-state chain in ${buildCpu.toFixed(1)} s CPU and wrote it as a Matrix Market file`);
    const run = timedCliWithStats(["lump", file, "--exact", "--json"]);
    const line = JSON.parse(run.stdout) as { blocks: number; partition: number[] };
    console.log(
      `CLI lump FILE --exact --json, 1,000,000 states / ${big.col.length} transitions (read, exact row check, refinement, JSON out): ${run.wall.toFixed(1)} s wall, ${run.cpu.toFixed(1)} s CPU, peak ${run.rssMb.toFixed(0)} MB (targets < 15 s, < 4096 MB); ${line.blocks} blocks over ${line.partition.length} states; ${(run.wall / inProcessWall).toFixed(1)}x the in-process refinement's wall time`,
    );
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
