import type { NextAuthConfig } from "next-auth";
import { env } from "@/env";

/**
 * The part of the auth configuration that needs no database; `auth.ts` adds the providers.
 */
export const authConfig = {
  secret: env.AUTH_SECRET,
  // The app runs behind whatever host name the operator gives it (localhost in the demo).
  trustHost: true,
  session: { strategy: "jwt" },
  pages: { signIn: "/sign-in" },
  providers: [],
  callbacks: {
    jwt({ token, user }) {
      if (user?.id) token.sub = user.id;
      return token;
    },
    session({ session, token }) {
      if (token.sub) session.user.id = token.sub;
      return session;
    },
  },
} satisfies NextAuthConfig;
