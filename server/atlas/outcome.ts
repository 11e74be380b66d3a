import type { VerifyOutcome } from "./verify-task";
import { AppError } from "@/server/errors";
import type { Verified } from "./verify-task";

/**
 * Every verdict but "holds" as the error the API answers with: malformed → 400 naming the field,
 * too large → 413 with the bound, fails → 422 with the counterexample.
 */
export function requireHolds(outcome: VerifyOutcome, field = "certificate"): Verified {
  switch (outcome.status) {
    case "holds":
      return outcome;
    case "malformed": {
      const first = outcome.issues[0] ?? { path: "", message: "malformed" };
      const at = first.path ? `${field}.${first.path}` : field;
      return fail(new AppError("bad_input", `${at}: ${first.message}`, { field: at, details: { issues: outcome.issues } }));
    }
    case "too-large":
      return fail(
        new AppError("too_large", `The check exceeds the limit on ${outcome.bound}: ${outcome.asked} > ${outcome.limit}.`, {
          field,
          details: { bound: outcome.bound, limit: outcome.limit, asked: outcome.asked },
        }),
      );
    case "fails":
      return fail(
        new AppError("does_not_commute", "The square does not commute; nothing was written.", {
          field,
          details: { address: outcome.address || undefined, counterexample: outcome.counterexample },
        }),
      );
    case "model":
    case "address":
    case "chain":
    case "broken-chain":
    case "derived":
      return fail(new AppError("internal", "The verification worker answered a different question."));
  }
}

function fail(err: AppError): never {
  throw err;
}
