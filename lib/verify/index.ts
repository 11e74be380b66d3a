/** The checker: small, pure, separate from any search code; returns a typed result and never throws. */
export { CHECKER_VERSION, verifyCertificate } from "./verifyCertificate";
export type { VerifyResult } from "./verifyCertificate";
export { DEFAULT_LIMITS, exceededLimit } from "./limits";
export type { LimitExceeded, Limits } from "./limits";
