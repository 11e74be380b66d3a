import { getToken } from "next-auth/jwt";
import { NextResponse, type NextRequest } from "next/server";
import { env } from "@/env";

/** The signed-in pages: a signed-out visitor is sent to /sign-in. */
const SIGNED_IN_PREFIXES = ["/dashboard", "/atlas", "/chains", "/jobs", "/settings", "/dev"];

/**
 * Runs before routing. It refuses a path whose percent-escapes do not decode (the router would
 * otherwise fail on it with a 500), and sends signed-out visitors of the signed-in pages to
 * /sign-in. It decides nothing else: every page, server action and route handler checks the
 * session and the role itself.
 *
 * It only reads the session cookie. The auth library's own proxy wrapper re-issues that cookie on
 * every request, and on a sign-out action its fresh cookie raced the action's deletion and won.
 */
export default async function proxy(request: NextRequest) {
  const pathname = request.nextUrl.pathname;
  if (!decodes(pathname)) return malformedPath(pathname);
  if (!SIGNED_IN_PREFIXES.some((p) => pathname === p || pathname.startsWith(`${p}/`))) return NextResponse.next();
  const protocol = request.headers.get("x-forwarded-proto") ?? request.nextUrl.protocol.replace(":", "");
  const token = await getToken({ req: request, secret: env.AUTH_SECRET, secureCookie: protocol === "https" });
  if (token?.sub) return NextResponse.next();
  const signIn = new URL("/sign-in", request.nextUrl);
  signIn.searchParams.set("callbackUrl", pathname + request.nextUrl.search);
  return NextResponse.redirect(signIn);
}

function decodes(pathname: string): boolean {
  try {
    decodeURIComponent(pathname);
    return true;
  } catch {
    return false;
  }
}

/** 400 in the API's error shape: the path holds a `%` escape that is not UTF-8 (RFC 3986 §2.1). */
function malformedPath(pathname: string): Response {
  const error = { code: "bad_input", message: "The path holds a malformed percent-escape.", field: "path" };
  if (pathname.startsWith("/api/")) return Response.json({ error }, { status: 400 });
  return new Response("Bad request: the address holds a malformed percent-escape.", {
    status: 400,
    headers: { "content-type": "text/plain; charset=utf-8" },
  });
}

export const config = {
  matcher: [
    "/dashboard/:path*",
    "/atlas/:path*",
    "/chains/:path*",
    "/jobs/:path*",
    "/settings/:path*",
    "/dev/:path*",
    // Any other path with a percent-escape: checked for one that does not decode.
    "/:path(.*%.*)",
  ],
};
