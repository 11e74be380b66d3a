import NextAuth from "next-auth";
import { NextResponse } from "next/server";
import { authConfig } from "@/auth.config";

/**
 * Sends signed-out visitors of the signed-in pages to /sign-in, and gives the refusal page its 403
 * status. It decides nothing else: every page, server action and route handler checks the session
 * and the role itself.
 */
const { auth } = NextAuth({
  ...authConfig,
  callbacks: {
    ...authConfig.callbacks,
    authorized({ auth: session, request }) {
      if (request.nextUrl.pathname === "/forbidden") return NextResponse.rewrite(request.nextUrl, { status: 403 });
      return Boolean(session?.user);
    },
  },
});

export default auth;

export const config = {
  matcher: ["/dashboard/:path*", "/atlas/:path*", "/chains/:path*", "/jobs/:path*", "/settings/:path*", "/dev/:path*", "/forbidden"],
};
