import { fullLimits, DEFAULT_LIMITS, type Limits } from "./limits";
import { rawInputRefusal } from "./rawInputRefusal";
import { malformed, tooLarge, type Refusal } from "./refusal";
import { scanJsonText } from "./scanJsonText";

export type ReadResult = { ok: true; value: unknown } | { ok: false; verdict: Refusal };

/**
 * Reads a certificate's JSON text with every bound that needs no arithmetic checked first, in this order:
 * its length (maxTextLength), its nesting (maxNesting, before the parser runs), that it is JSON, that no
 * object repeats a member name (I-JSON, RFC 7493 §2.3), then the bounds of rawInputRefusal (digits of
 * every rational, states, steps, block, sizes, the cost of reading a matrix). No number is converted,
 * reduced or added before all of these pass. The server calls this on a request body before anything else.
 */
export function readCertificateText(text: string, limits: Limits = DEFAULT_LIMITS): ReadResult {
  const all = fullLimits(limits);
  if (text.length > all.maxTextLength) return { ok: false, verdict: tooLarge("maxTextLength", all.maxTextLength, text.length) };
  const scan = scanJsonText(text, all.maxNesting);
  if (scan.tooDeep) return { ok: false, verdict: scan.tooDeep };
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (e) {
    return { ok: false, verdict: malformed("", `not JSON: ${e instanceof Error ? e.message : String(e)}`) };
  }
  if (scan.duplicate) return { ok: false, verdict: scan.duplicate };
  const refusal = rawInputRefusal(value, all);
  return refusal ? { ok: false, verdict: refusal } : { ok: true, value };
}
