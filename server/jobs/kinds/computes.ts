// Loaded by the job worker threads (server/jobs/worker.mjs): lib/ only, no database, no Next.
import { compute as ecaAtlas } from "./eca-atlas.compute";
import { compute as lumpChain } from "./lump-chain.compute";
import { compute as lumpLargeChain } from "./lump-large-chain.compute";
import { compute as searchProjection } from "./search-projection.compute";
import { compute as totalisticAtlas } from "./totalistic-atlas.compute";
import { compute as verifyChain } from "./verify-chain.compute";
import { compute as verifyMap } from "./verify-map.compute";
import type { ComputeContext } from "./types";

export type ComputeFunction = (params: never, context: ComputeContext) => unknown;

/**
 * The compute step of every product job kind, by the key a kind names in `compute`. A static table
 * rather than a module path built at run time, so that the production build traces these files
 * alone; a new kind adds one line here and one in index.ts.
 */
export const COMPUTES = {
  "eca-atlas": ecaAtlas,
  "lump-chain": lumpChain,
  "lump-large-chain": lumpLargeChain,
  "search-projection": searchProjection,
  "totalistic-atlas": totalisticAtlas,
  "verify-chain": verifyChain,
  "verify-map": verifyMap,
} satisfies Record<string, ComputeFunction>;

export type ComputeKey = keyof typeof COMPUTES;
