import NextAuth from "next-auth";
import Credentials from "next-auth/providers/credentials";
import { z } from "zod";
import { authConfig } from "@/auth.config";
import { getUserByEmail, markEmailVerified } from "@/db/queries/users";
import { verifyPassword } from "@/server/auth/password";
import { consumeSignInLink } from "@/server/auth/sign-in-link";

const PasswordCredentials = z.object({ email: z.string().trim().email(), password: z.string().min(1).max(200) });
const LinkCredentials = z.object({ token: z.string().min(20).max(200) });

/** The session's `user.id` is our users.id; sessions are JWTs, so no session table is needed. */
export const { handlers, auth, signIn, signOut } = NextAuth({
  ...authConfig,
  providers: [
    Credentials({
      id: "password",
      name: "E-mail and password",
      credentials: { email: {}, password: {} },
      async authorize(raw) {
        const parsed = PasswordCredentials.safeParse(raw);
        if (!parsed.success) return null;
        const user = await getUserByEmail({ email: parsed.data.email });
        const ok = await verifyPassword(parsed.data.password, user?.passwordHash);
        return user && ok ? { id: user.id, email: user.email, name: user.name } : null;
      },
    }),
    Credentials({
      id: "email-link",
      name: "E-mail sign-in link",
      credentials: { token: {} },
      async authorize(raw) {
        const parsed = LinkCredentials.safeParse(raw);
        if (!parsed.success) return null;
        const email = await consumeSignInLink(parsed.data.token);
        const user = email ? await getUserByEmail({ email }) : null;
        if (!user) return null;
        await markEmailVerified({ id: user.id });
        return { id: user.id, email: user.email, name: user.name };
      },
    }),
  ],
});
