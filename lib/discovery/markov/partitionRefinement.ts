/**
 * Coarsest strongly lumpable partition refining an initial one, by splitter-based refinement
 * (Derisavi, Hermanns & Sanders, Inf. Process. Lett. 87, 2003; Valmari & Franceschinis, TACAS 2010):
 * for a splitter block S every state i gets w(i) = Σ_{j∈S} P[i][j], computed over the in-edges of S only,
 * and each block is split by w. After a block splits, all its parts but the largest become splitters
 * ("process the smaller half"): the partition is already stable with respect to the union, so stability with
 * respect to the largest part follows. Each state is in O(log n) splitters, giving O(m log n) sums.
 * Run on the transposed chain it gives the coarsest exact lumping (column sums); there the whole state space is
 * not a stable splitter (column totals differ), so every initial block starts as a splitter (`allInitial`).
 */
import type { ScaledEntries, SparseChain } from "./sparseChain";

export interface Refinement {
  /** state → block, blocks in order of first appearance */
  partition: Int32Array;
  blocks: number;
}

export function refineToLumping(
  chain: Pick<SparseChain, "size" | "rowStart" | "col">,
  scaled: ScaledEntries,
  initial: ArrayLike<number>,
  shouldStop: () => boolean = () => false,
  allInitial = false,
): Refinement | null {
  const n = chain.size;
  const { rowStart, col } = chain;
  // in-edges by target state
  const inStart = new Int32Array(n + 1);
  for (let e = 0; e < col.length; e++) inStart[col[e] + 1]++;
  for (let j = 0; j < n; j++) inStart[j + 1] += inStart[j];
  const fill = inStart.slice(0, n);
  const inFrom = new Int32Array(col.length);
  const inEdge = new Int32Array(col.length);
  for (let i = 0; i < n; i++) {
    for (let e = rowStart[i]; e < rowStart[i + 1]; e++) {
      const k = fill[col[e]]++;
      inFrom[k] = i;
      inEdge[k] = e;
    }
  }

  // blocks as segments [start, end) of a permutation of the states
  const elems = new Int32Array(n);
  const pos = new Int32Array(n);
  const blockOf = new Int32Array(n);
  const start: number[] = [];
  const end: number[] = [];
  {
    const byLabel = new Map<number, number[]>();
    for (let i = 0; i < n; i++) {
      const list = byLabel.get(initial[i]);
      if (list) list.push(i);
      else byLabel.set(initial[i], [i]);
    }
    let k = 0;
    for (const list of byLabel.values()) {
      const b = start.length;
      start.push(k);
      for (const i of list) {
        elems[k] = i;
        pos[i] = k++;
        blockOf[i] = b;
      }
      end.push(k);
    }
  }
  const queue: number[] = [];
  const inQueue: boolean[] = start.map(() => false);
  {
    let largest = 0;
    for (let b = 1; b < start.length; b++) if (end[b] - start[b] > end[largest] - start[largest]) largest = b;
    for (let b = 0; b < start.length; b++)
      if (b !== largest || allInitial) {
        queue.push(b);
        inQueue[b] = true;
      }
  }

  const numeric = scaled.kind === "number" ? scaled.num : null;
  const bigNum = scaled.kind === "bigint" ? scaled.num : null;
  const sumNum = new Float64Array(n);
  const sumBig: bigint[] = bigNum ? new Array<bigint>(n).fill(0n) : [];
  const stamp = new Int32Array(n);
  const blockStamp: number[] = start.map(() => 0);
  const touchedIn: number[][] = start.map(() => []);
  let round = 0;

  while (queue.length > 0) {
    if (shouldStop()) return null;
    const s = queue.pop() as number;
    inQueue[s] = false;
    round++;
    const touched: number[] = [];
    for (let k = start[s]; k < end[s]; k++) {
      const j = elems[k];
      for (let t = inStart[j]; t < inStart[j + 1]; t++) {
        const i = inFrom[t];
        if (stamp[i] !== round) {
          stamp[i] = round;
          touched.push(i);
          if (numeric) sumNum[i] = 0;
          else sumBig[i] = 0n;
        }
        if (numeric) sumNum[i] += numeric[inEdge[t]];
        else sumBig[i] += (bigNum as bigint[])[inEdge[t]];
      }
    }
    const blocksTouched: number[] = [];
    for (const i of touched) {
      const b = blockOf[i];
      if (blockStamp[b] !== round) {
        blockStamp[b] = round;
        touchedIn[b] = [];
        blocksTouched.push(b);
      }
      touchedIn[b].push(i);
    }
    for (const b of blocksTouched) {
      const members = touchedIn[b];
      const size = end[b] - start[b];
      const groups = new Map<number | bigint, number[]>();
      for (const i of members) {
        const key = numeric ? sumNum[i] : sumBig[i];
        const g = groups.get(key);
        if (g) g.push(i);
        else groups.set(key, [i]);
      }
      if (groups.size === 1 && members.length === size) continue;
      // move touched groups to the back of the segment, each a new block; the front keeps id b: the untouched
      // states, or the first group when every state was touched
      let back = end[b];
      const parts: number[] = [];
      const groupList = [...groups.values()];
      const last = members.length === size ? 1 : 0;
      for (let gi = groupList.length - 1; gi >= last; gi--) {
        const group = groupList[gi];
        for (const i of group) {
          back--;
          const other = elems[back];
          const from = pos[i];
          elems[from] = other;
          pos[other] = from;
          elems[back] = i;
          pos[i] = back;
        }
        const nb = start.length;
        start.push(back);
        end.push(back + group.length);
        inQueue.push(false);
        blockStamp.push(0);
        touchedIn.push([]);
        for (const i of group) blockOf[i] = nb;
        parts.push(nb);
      }
      end[b] = back;
      parts.push(b);
      if (inQueue[b]) {
        for (const p of parts)
          if (!inQueue[p]) {
            queue.push(p);
            inQueue[p] = true;
          }
      } else {
        let largest = parts[0];
        for (const p of parts) if (end[p] - start[p] > end[largest] - start[largest]) largest = p;
        for (const p of parts)
          if (p !== largest) {
            queue.push(p);
            inQueue[p] = true;
          }
      }
    }
  }

  const partition = new Int32Array(n);
  const renumber = new Map<number, number>();
  for (let i = 0; i < n; i++) {
    let r = renumber.get(blockOf[i]);
    if (r === undefined) {
      r = renumber.size;
      renumber.set(blockOf[i], r);
    }
    partition[i] = r;
  }
  return { partition, blocks: renumber.size };
}
