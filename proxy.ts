import NextAuth from "next-auth";
import { authConfig } from "@/auth.config";

/**
 * Sends signed-out visitors of the signed-in pages to /sign-in. It decides nothing else: every page,
 * server action and route handler checks the session and the role itself.
 */
export default NextAuth(authConfig).auth;

export const config = {
  matcher: ["/dashboard/:path*", "/atlas/:path*", "/chains/:path*", "/jobs/:path*", "/settings/:path*", "/dev/:path*"],
};
