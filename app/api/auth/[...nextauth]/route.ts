import { handlers } from "@/auth";
import { checkRateLimit, clientAddress, refundAttempt } from "@/server/auth/rate-limit";

export const { GET } = handlers;

/**
 * The auth library's endpoints, with the password sign-in (`/api/auth/callback/password`) rate
 * limited by account and by client address: past the limit it answers 429 with Retry-After (RFC 6585
 * §4) before any password is checked, the same for an unknown address as for a known one.
 */
export async function POST(request: Request): Promise<Response> {
  if (!new URL(request.url).pathname.endsWith("/callback/password")) return handlers.POST(request as never);
  const form = await request.clone().formData().catch(() => null);
  const email = String(form?.get("email") ?? "").slice(0, 254);
  const address = clientAddress(request.headers);
  const decision = await checkRateLimit({ action: "sign-in", email, address });
  if (!decision.allowed) {
    return Response.json(
      {
        error: {
          code: "too_many_requests",
          message: `Too many sign-in attempts; try again in ${decision.retryAfterSeconds} seconds.`,
          details: { limitedBy: decision.limitedBy, retryAfterSeconds: decision.retryAfterSeconds },
        },
      },
      { status: 429, headers: { "retry-after": String(decision.retryAfterSeconds) } },
    );
  }
  const response = await handlers.POST(request as never);
  if (signedIn(response)) await refundAttempt({ action: "sign-in", email, address });
  return response;
}

/** A failed credentials sign-in redirects (or answers) with `error=` in the address; a success does not. */
function signedIn(response: Response): boolean {
  const location = response.headers.get("location") ?? "";
  const json = response.headers.get("content-type")?.includes("json") ?? false;
  return response.status < 400 && !json ? location !== "" && !/[?&]error=/.test(location) : false;
}
