import { CaInputError } from "@/lib/ca";
import { MatrixInputError } from "@/lib/markov";
import type { Issue } from "@/lib/models";
import { CertificateInputError, canonicalCertificate, certificateAddress, type Certificate, type Counterexample } from "@/lib/certificate";
import { checkSquare, type Equation } from "./checkSquare";
import { DEFAULT_LIMITS, exceededLimit, type Limits } from "./limits";
import { rawInputRefusal } from "./rawInputRefusal";
import { readCertificateText } from "./readCertificateText";
import { structureIssues } from "./structureIssues";

/** Bumped whenever the checker's behaviour changes; recorded with every verification. 2: target labels checked, targets by value, wrong encodings malformed, bounds before any work. */
export const CHECKER_VERSION = "squarely-checker/2";

export type VerifyResult =
  | { status: "holds"; address: string; certificate: Certificate; checkerVersion: string; equation: Equation }
  | { status: "fails"; address: string; counterexample: Counterexample }
  | { status: "malformed"; issues: Issue[] }
  | { status: "too-large"; bound: string; limit: number; asked: number };

/**
 * Verifies a certificate (a parsed JSON value or its text) and never throws: the raw bounds (text,
 * nesting, duplicate names, digits, sizes: readCertificateText / rawInputRefusal, before any arithmetic)
 * → canonical form → structure → predicted sizes and cost → seal → the exhaustive check.
 */
export function verifyCertificate(input: unknown, limits: Limits = DEFAULT_LIMITS): VerifyResult {
  try {
    return verify(input, limits);
  } catch (e) {
    return { status: "malformed", issues: [{ path: "", message: `could not check the certificate: ${e instanceof Error ? e.message : String(e)}` }] };
  }
}

function verify(input: unknown, limits: Limits): VerifyResult {
  let value = input;
  if (typeof input === "string") {
    const read = readCertificateText(input, limits);
    if (!read.ok) return read.verdict;
    value = read.value;
  } else {
    const refusal = rawInputRefusal(input, limits);
    if (refusal) return refusal;
  }
  let cert: Certificate;
  try {
    cert = canonicalCertificate(value);
  } catch (e) {
    if (e instanceof CertificateInputError) return { status: "malformed", issues: e.issues };
    throw e;
  }
  const issues = structureIssues(cert);
  if (issues.length > 0) return { status: "malformed", issues };
  const tooLarge = exceededLimit(cert, limits);
  if (tooLarge) return { status: "too-large", ...tooLarge };
  const address = certificateAddress(cert);
  if (cert.address !== undefined && cert.address !== address)
    return {
      status: "malformed",
      issues: [{ path: "address", message: `the certificate carries the address ${cert.address}, but its content hashes to ${address}, so the address names other content. An address is an unkeyed SHA-256 that anyone can recompute: it identifies content, not who issued it` }],
    };
  let square;
  try {
    square = checkSquare(cert);
  } catch (e) {
    if (e instanceof CaInputError || e instanceof MatrixInputError) return { status: "malformed", issues: [{ path: `map.${e.field}`, message: e.message }] };
    throw e;
  }
  if (square.holds === null) return { status: "malformed", issues: square.issues };
  if (!square.holds) return { status: "fails", address, counterexample: square.counterexample };
  return { status: "holds", address, certificate: { ...cert, address }, checkerVersion: CHECKER_VERSION, equation: square.equation };
}
