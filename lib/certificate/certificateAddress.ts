import canonicalize from "canonicalize";
import { sha256Hex } from "@/lib/models";
import { canonicalCertificate } from "./canonicalCertificate";
import type { Certificate } from "./schema";

/**
 * "sha256:" + SHA-256 of the RFC 8785 canonical JSON of the canonical certificate without its `address`
 * seal: two spellings of the same certificate get one address (DOMAIN.md §5).
 */
export function certificateAddress(cert: Certificate | unknown): string {
  const { address: _seal, ...content } = canonicalCertificate(cert);
  return `sha256:${sha256Hex(canonicalize(content) as string)}`;
}

/** The canonical certificate carrying its own address, as issued. */
export function sealCertificate(cert: Certificate | unknown): Certificate {
  const { address: _old, ...content } = canonicalCertificate(cert);
  return { ...content, address: certificateAddress(content) };
}

/** The issued file form: RFC 8785 canonical JSON of the sealed certificate (no insignificant whitespace). */
export function certificateText(cert: Certificate): string {
  return canonicalize(sealCertificate(cert)) as string;
}
