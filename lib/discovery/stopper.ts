/** Why a long search ended early: cancelled through its AbortSignal, or past its time budget. */
export type Stopped = "cancelled" | "deadline" | null;

export type ProgressCallback = (fraction: number, item: string) => void;

/** The options every long search takes. */
export interface LongRunOptions {
  onProgress?: ProgressCallback;
  signal?: AbortSignal;
  /** time budget in milliseconds from the start of the call */
  deadlineMs?: number;
  /** the clock the budget is measured on, in milliseconds; @default performance.now */
  clock?: () => number;
}

/** A poll function answering whether (and why) to stop now; it is cheap enough to call between search nodes. */
export function makeStopper(options: LongRunOptions): () => Stopped {
  const clock = options.clock ?? (() => performance.now());
  const deadline = options.deadlineMs === undefined ? Infinity : clock() + options.deadlineMs;
  let reason: Stopped = null;
  return () => {
    if (reason) return reason;
    if (options.signal?.aborted) reason = "cancelled";
    else if (deadline !== Infinity && clock() > deadline) reason = "deadline";
    return reason;
  };
}
