/**
 * next-auth v4 configuration: e-mail + password credentials, JWT sessions.
 * The JWT carries only the user id; every request re-reads the user (lib/auth/session.ts) so a
 * deactivated account or a changed role takes effect at once, not when the token expires.
 */
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { appEnv } from "../config/env";
import { signInSchema } from "../validation/user";
import { attemptSignIn } from "./sign-in";

export const SIGN_IN_PATH = "/sign-in";

export function authOptions(): NextAuthOptions {
  const env = appEnv();
  return {
    secret: env.NEXTAUTH_SECRET,
    session: { strategy: "jwt", maxAge: 12 * 60 * 60 },
    pages: { signIn: SIGN_IN_PATH },
    providers: [
      CredentialsProvider({
        name: "E-mail and password",
        credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
        async authorize(credentials) {
          const parsed = signInSchema.safeParse(credentials ?? {});
          if (!parsed.success) throw new Error("Enter your e-mail address and password.");
          const outcome = await attemptSignIn(parsed.data.email, parsed.data.password, env.COILYARD_SIGNIN_LOCK_MINUTES);
          if (!outcome.ok) throw new Error(outcome.message);
          return { id: outcome.user.id, email: outcome.user.email, name: outcome.user.name };
        },
      }),
    ],
    callbacks: {
      async jwt({ token, user }) {
        if (user) token.sub = user.id;
        return token;
      },
      async session({ session, token }) {
        if (session.user && token.sub) (session.user as { id?: string }).id = token.sub;
        return session;
      },
    },
  };
}
