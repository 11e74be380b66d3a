/** Chains of certificates: pasting commuting squares into one (DOMAIN.md §3). */
export { composeChain } from "./composeChain";
export type { ChainResult } from "./composeChain";
export { composePair } from "./composePair";
export type { Composed } from "./composePair";
