/**
 * How a stored chain was verified, in words: a short name for badges and lists, and the sentence that
 * says what was checked. The stored identifier ("links", "links+composite") stays for the API and titles.
 */
export type ChainVerification = "links" | "links+composite";

export const VERIFICATION_NAME: Record<ChainVerification, string> = {
  links: "each link verified",
  "links+composite": "each link and the composite verified",
};

export const VERIFICATION_SENTENCE: Record<ChainVerification, string> = {
  links: "Every link's certificate verified and each link's target is the next link's source exactly. The composite was not checked on its own (it exceeds the size limits); pasting commuting squares suffices mathematically.",
  "links+composite": "Every link's certificate verified, each link's target is the next link's source exactly, and the composite certificate also verified directly by its own exhaustive check.",
};

/** The short name of a verification read from JSON (a job result); an unknown value is shown as it is. */
export function verificationName(value: string): string {
  return value in VERIFICATION_NAME ? VERIFICATION_NAME[value as ChainVerification] : value;
}
