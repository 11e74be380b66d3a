import { getToken } from "next-auth/jwt";
import { NextResponse, type NextRequest } from "next/server";
import { env } from "@/env";

/**
 * Sends signed-out visitors of the signed-in pages to /sign-in. It decides nothing else: every page, server action and route handler checks the session
 * and the role itself.
 *
 * It only reads the session cookie. The auth library's own proxy wrapper re-issues that cookie on
 * every request, and on a sign-out action its fresh cookie raced the action's deletion and won.
 */
export default async function proxy(request: NextRequest) {
  const protocol = request.headers.get("x-forwarded-proto") ?? request.nextUrl.protocol.replace(":", "");
  const token = await getToken({ req: request, secret: env.AUTH_SECRET, secureCookie: protocol === "https" });
  if (token?.sub) return NextResponse.next();
  const signIn = new URL("/sign-in", request.nextUrl);
  signIn.searchParams.set("callbackUrl", request.nextUrl.pathname + request.nextUrl.search);
  return NextResponse.redirect(signIn);
}

export const config = {
  matcher: ["/dashboard/:path*", "/atlas/:path*", "/chains/:path*", "/jobs/:path*", "/settings/:path*", "/dev/:path*"],
};
