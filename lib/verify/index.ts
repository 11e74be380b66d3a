/** The checker: small, pure, separate from any search code; returns a typed result and never throws. */
export { CHECKER_VERSION, verifyCertificate } from "./verifyCertificate";
export type { VerifyResult } from "./verifyCertificate";
export { DEFAULT_LIMITS, caCost, chainCost, exceededLimit, fullLimits } from "./limits";
export type { Bound, LimitExceeded, Limits } from "./limits";
export { readCertificateText } from "./readCertificateText";
export type { ReadResult } from "./readCertificateText";
export { rawInputRefusal } from "./rawInputRefusal";
export { buildRequestRefusal } from "./buildRequestRefusal";
export type { Refusal } from "./refusal";
export type { Equation } from "./checkSquare";
