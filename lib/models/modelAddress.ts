import canonicalize from "canonicalize";
import type { Model } from "./schema";
import { sha256Hex } from "./sha256";

/** "sha256:<hex>" of the RFC 8785 (JSON Canonicalization Scheme) form of an already canonical model. */
export function modelAddress(model: Model): string {
  return `sha256:${sha256Hex(canonicalize(model) as string)}`;
}

export function modelsEqual(a: Model, b: Model): boolean {
  return canonicalize(a) === canonicalize(b);
}
