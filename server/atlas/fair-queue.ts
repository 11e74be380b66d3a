/**
 * A fair queue in front of a few worker threads. Each waiting task belongs to a workspace and a
 * person; when a thread frees up, it goes to the waiting task whose workspace has the fewest tasks
 * running, then whose person has the fewest running, then the one that waited longest (max-min
 * fair sharing; Demers, Keshav & Shenker, "Analysis and simulation of a fair queueing algorithm",
 * SIGCOMM 1989), ties going round robin to whoever was served least recently. Small tasks also have a lane of their own that large tasks never enter, so a
 * small check never waits behind large ones. A task's time bound starts when it gets a thread.
 */
export type Lane = "main" | "fast";
export type Owner = { workspaceId: string; userId: string };
/** `run` is told which lane's thread it got. */
export type FairTask<T> = Owner & { small: boolean; run: (lane: Lane) => Promise<T> };

type Waiting = FairTask<unknown> & { seq: number; resolve: (v: unknown) => void; reject: (e: unknown) => void };

export type FairQueueOptions = {
  /** Threads per lane: "main" takes any task, "fast" only small ones. */
  slots: Record<Lane, number>;
  /** Tasks one person may have waiting; more are refused by `onFull`. */
  maxWaitingPerPerson: number;
  onFull: (owner: Owner, waiting: number) => Error;
};

export class FairQueue {
  private readonly waiting: Waiting[] = [];
  private readonly running = { main: 0, fast: 0 };
  private readonly byWorkspace = new Map<string, number>();
  private readonly byPerson = new Map<string, number>();
  /** When each workspace ("w:") and person ("p:") last got a thread, in dispatch ticks. */
  private readonly lastServed = new Map<string, number>();
  private seq = 0;
  private tick = 0;

  constructor(private readonly options: FairQueueOptions) {}

  /** Runs `task.run` once a thread of a lane it may use is free; settles with its result. */
  submit<T>(task: FairTask<T>): Promise<T> {
    const mine = this.waiting.filter((w) => w.userId === task.userId).length;
    if (mine >= this.options.maxWaitingPerPerson) return Promise.reject(this.options.onFull(task, mine));
    return new Promise<T>((resolve, reject) => {
      this.waiting.push({ ...task, seq: this.seq++, resolve: resolve as (v: unknown) => void, reject } as Waiting);
      this.dispatch();
    });
  }

  /** Tasks waiting and running, for tests and for an operator's view. */
  snapshot(): { waiting: number; running: Record<Lane, number> } {
    return { waiting: this.waiting.length, running: { ...this.running } };
  }

  private dispatch(): void {
    for (const lane of ["fast", "main"] as const) {
      while (this.running[lane] < this.options.slots[lane]) {
        const next = this.pick(lane);
        if (!next) break;
        this.start(next, lane);
      }
    }
  }

  private pick(lane: Lane): Waiting | undefined {
    let best: Waiting | undefined;
    for (const w of this.waiting) {
      if (lane === "fast" && !w.small) continue;
      if (!best || this.before(w, best)) best = w;
    }
    if (best) this.waiting.splice(this.waiting.indexOf(best), 1);
    return best;
  }

  /** Fewest running, then served least recently (round robin), for the workspace and then the person. */
  private before(a: Waiting, b: Waiting): boolean {
    const keys: [Map<string, number>, string, string][] = [
      [this.byWorkspace, a.workspaceId, b.workspaceId],
      [this.lastServed, `w:${a.workspaceId}`, `w:${b.workspaceId}`],
      [this.byPerson, a.userId, b.userId],
      [this.lastServed, `p:${a.userId}`, `p:${b.userId}`],
    ];
    for (const [counts, x, y] of keys) {
      const d = (counts.get(x) ?? -1) - (counts.get(y) ?? -1);
      if (d !== 0) return d < 0;
    }
    return a.seq < b.seq;
  }

  private start(task: Waiting, lane: Lane): void {
    this.running[lane]++;
    this.tick++;
    this.lastServed.set(`w:${task.workspaceId}`, this.tick);
    this.lastServed.set(`p:${task.userId}`, this.tick);
    bump(this.byWorkspace, task.workspaceId, 1);
    bump(this.byPerson, task.userId, 1);
    const done = () => {
      this.running[lane]--;
      bump(this.byWorkspace, task.workspaceId, -1);
      bump(this.byPerson, task.userId, -1);
      this.dispatch();
    };
    let running: Promise<unknown>;
    try {
      running = task.run(lane);
    } catch (err) {
      running = Promise.reject(err);
    }
    running.then(
      (value) => {
        done();
        task.resolve(value);
      },
      (err: unknown) => {
        done();
        task.reject(err);
      },
    );
  }
}

function bump(counts: Map<string, number>, key: string, by: number): void {
  const next = (counts.get(key) ?? 0) + by;
  if (next === 0) counts.delete(key);
  else counts.set(key, next);
}
