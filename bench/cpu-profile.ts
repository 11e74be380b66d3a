import { readFileSync } from "node:fs";

type Node = { id: number; callFrame: { functionName: string; url: string; lineNumber: number }; children?: number[]; hitCount?: number };
type Profile = { nodes: Node[]; samples: number[]; timeDeltas: number[] };

/** Where a file's code belongs, for the summary: our code by top folder, packages by name. */
function area(url: string): string {
  if (!url) return "(native / V8)";
  const pkg = /node_modules\/((?:@[^/]+\/)?[^/]+)/.exec(url);
  if (pkg) {
    const inner = /next\/dist\/compiled\/([^/]+)/.exec(url);
    return inner ? `next/compiled/${inner[1]}` : pkg[1];
  }
  if (url.includes("/.next/server/chunks/")) return ".next server chunks (our code and bundled packages)";
  if (url.startsWith("node:")) return url;
  return url.replace(/^file:\/\//, "").split("/").slice(-2).join("/");
}

/**
 * Self time of a V8 CPU profile (node --cpu-prof) summed per package or area and per function,
 * the top entries of each, as text.
 */
export function summariseCpuProfile(file: string, top = 15): string {
  const profile = JSON.parse(readFileSync(file, "utf8")) as Profile;
  const byId = new Map(profile.nodes.map((n) => [n.id, n]));
  const selfMs = new Map<number, number>();
  profile.samples.forEach((id, i) => selfMs.set(id, (selfMs.get(id) ?? 0) + (profile.timeDeltas[i] ?? 0) / 1000));
  const total = [...selfMs.values()].reduce((a, b) => a + b, 0);
  const perArea = new Map<string, number>();
  const perFunction = new Map<string, number>();
  for (const [id, ms] of selfMs) {
    const frame = byId.get(id)!.callFrame;
    const where = area(frame.url);
    perArea.set(where, (perArea.get(where) ?? 0) + ms);
    const fn = `${frame.functionName || "(anonymous)"} ${where}:${frame.lineNumber + 1}`;
    perFunction.set(fn, (perFunction.get(fn) ?? 0) + ms);
  }
  const rows = (m: Map<string, number>) =>
    [...m.entries()]
      .sort((a, b) => b[1] - a[1])
      .slice(0, top)
      .map(([k, ms]) => `  ${((100 * ms) / total).toFixed(1).padStart(5)}%  ${k}`)
      .join("\n");
  return `CPU profile of the server (${(total / 1000).toFixed(1)} s sampled), self time by area:\n${rows(perArea)}\nby function:\n${rows(perFunction)}`;
}
