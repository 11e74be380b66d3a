// The few parts of autocannon's API that bench/api.bench.ts uses (the package ships no types).
declare module "autocannon" {
  import type { EventEmitter } from "node:events";
  type RequestParams = { method?: string; path?: string; headers?: Record<string, string>; body?: string };
  type Options = {
    url: string;
    connections?: number;
    duration?: number;
    headers?: Record<string, string>;
    requests?: (RequestParams & { setupRequest?: (req: RequestParams) => RequestParams })[];
  };
  type Result = { requests: { average: number; total: number }; errors: number; timeouts: number; non2xx: number };
  type Instance = EventEmitter & PromiseLike<Result>;
  export default function autocannon(options: Options): Instance;
}
