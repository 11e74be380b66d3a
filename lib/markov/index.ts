/** Finite Markov chains with exact rational transition matrices: powers, strong lumping, matrix files. */
export type { Matrix } from "./matrix";
export { MatrixInputError, formatMatrix, identityMatrix, matricesEqual, matrixProduct } from "./matrix";
export { isStochastic, stochasticIssue } from "./isStochastic";
export { matrixPower } from "./matrixPower";
export { canonicalPartition, blockCount } from "./canonicalPartition";
export { checkLumping } from "./checkLumping";
export type { LumpingCheck, LumpingCounterexample } from "./checkLumping";
export { checkExactLumping } from "./checkExactLumping";
export type { ExactLumpingCheck, ExactLumpingCounterexample } from "./checkExactLumping";
export { parseCsvMatrix, parseMatrixMarket } from "./parseMatrix";
export type { ParseMatrixOptions } from "./parseMatrix";
export { stationaryDistributions, communicatingClasses, applyRow } from "./stationaryDistributions";
export type { StationaryClass, StationaryResult } from "./stationaryDistributions";
export { checkExactLumpingSparse } from "./checkExactLumpingSparse";
export type { LumpedEntry, SparseExactLumpingCheck, SparseRows } from "./checkExactLumpingSparse";
