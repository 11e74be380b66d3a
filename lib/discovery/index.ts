/**
 * Discovery: searches that find coarse-grainings (CA projections and congruences, Markov lumpings).
 * Search code may be clever; nothing it finds is stored before the core's checker has verified a certificate.
 */
export { searchBinaryProjections, MAX_PROJECTION_BLOCK } from "./searchBinaryProjections";
export type { BinaryProjectionSearch, BinaryProjectionTarget } from "./searchBinaryProjections";
export { searchCongruences, MAX_CONGRUENCE_BLOCK } from "./searchCongruences";
export type { Congruence, CongruenceSearch } from "./searchCongruences";
export { buildEcaAtlas } from "./buildEcaAtlas";
export type { EcaAtlas, EcaAtlasOptions, PartitionAtlasRow, ProjectionAtlasRow } from "./buildEcaAtlas";
export { ecaClasses } from "./ca/ecaClasses";
export { DISCOVERY_VERSION, ALGORITHMS, coverageRecord } from "./coverage";
export type { Coverage, SearchKind } from "./coverage";
export type { LongRunOptions, ProgressCallback, Stopped } from "./stopper";
export type { RuleOption } from "./ca/ruleInput";
export { coarsestLumping, exactLumpedChain, lumpedChain } from "./coarsestLumping";
export type { CoarsestLumping, CoarsestLumpingOptions } from "./coarsestLumping";
export { allLumpings, MAX_ENUMERATED_STATES } from "./allLumpings";
export { sparseFromMatrix } from "./markov/sparseChain";
export type { ChainInput, SparseChain } from "./markov/sparseChain";
export { readSparseMatrixMarket, MAX_SPARSE_STATES } from "./markov/readSparseMatrixMarket";
export { buildTotalisticAtlas, totalisticTable, TOTALISTIC_CODES } from "./totalisticAtlas";
export type { TotalisticAtlas, TotalisticAtlasOptions, TotalisticAtlasRow } from "./totalisticAtlas";
export { permutationMixture } from "./markov/permutationMixture";
export type { PermutationMixtureSpec } from "./markov/permutationMixture";
export { searchAllCongruences, MAX_LISTED_CONGRUENCE_STATES } from "./searchAllCongruences";
