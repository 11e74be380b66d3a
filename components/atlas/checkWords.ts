/** Why a re-verification did not confirm a certificate, from its stored status ("fails", "too-large", …). */
export function checkReason(status: string): string {
  switch (status) {
    case "fails":
      return "the checker found a counterexample";
    case "malformed":
      return "the certificate is not well formed";
    case "too-large":
      return "the check exceeds the server's size limits";
    default:
      return "the check did not finish";
  }
}

/** A re-verification's stored status in words, for the certificate page's list of checks. */
export function checkWords(status: string): string {
  return status === "holds" ? "verified again, the square commutes" : `not confirmed: ${checkReason(status)}`;
}
