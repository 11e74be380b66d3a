// The compute table the job tests hand to their runners: the product's steps plus the test kind's.
import { COMPUTES as PRODUCT } from "@/server/jobs/kinds/computes";
import { compute as sleepAndCount } from "./jobs-sleep-kind";

export const COMPUTES = { ...PRODUCT, "test-sleep-and-count": sleepAndCount };

/** The file URL that a runner passes to its worker threads. */
export const TEST_COMPUTES = new URL("./jobs-computes.ts", import.meta.url).href;
