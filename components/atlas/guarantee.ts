/**
 * What a certificate's check proves and what it does not, in the words of the field (DOMAIN.md §2):
 * one sentence each, chosen by the kind of map.
 */
const SUPERSCRIPT = "⁰¹²³⁴⁵⁶⁷⁸⁹";

/** A power written as in print: P⁷ (for a number), or P^k. */
export function power(base: string, n: number | null): string {
  return n === null ? `${base}^k` : `${base}${String(n).split("").map((d) => SUPERSCRIPT[Number(d)]).join("")}`;
}

export function guaranteeOf(kind: string, block: number | null, steps: number | null): { proves: string; doesNot: string } {
  const T = steps ?? block;
  switch (kind) {
    case "projection":
    case "coarse-graining":
      return {
        proves: `The checker compared both sides of the square on every window of blocks: the coarse rule applied to the projected blocks equals the projection of the fine rule's ${T ?? "T"}-step result on the centre block of ${block ?? "N"} cells. A local rule that agrees on every window agrees on every configuration, finite or infinite, so the square commutes at block size ${block ?? "N"} and ${T ?? "T"} steps for every starting row.`,
        doesNot: "It does not prove that the rule entered is the one a paper means (compare the rule number), nor anything about other block sizes or step counts.",
      };
    case "lumping":
      return {
        proves: "The checker summed, in exact rational arithmetic, each state's probability of moving into every block and found the sums equal within every block (strong lumpability, Kemeny & Snell 1960, §6.3), and the lumped matrix equal to them entry by entry.",
        doesNot: "It holds for these exact rationals only: a chain with rounded or slightly different numbers needs its own certificate. It says nothing about a chain entered wrongly.",
      };
    case "decimation":
      return {
        proves: `The checker computed ${power("P", T)} exactly by repeated squaring and found it equal to the target matrix entry by entry.`,
        doesNot: "It holds for these exact rationals only, and says nothing about a chain entered wrongly.",
      };
    default:
      return {
        proves: "The checker recomputed the target model from the source exactly and found them equal.",
        doesNot: "It says nothing about a model entered wrongly.",
      };
  }
}
