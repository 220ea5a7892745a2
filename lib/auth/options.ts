import "server-only";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { raiseSessionVersion } from "@/db/queries/users";
import { SIGN_IN_REFUSED, signInSchema } from "./schemas";
import { signInWithLimits, TooManySignInsError } from "./sign-in-limits";

/**
 * The client's address: the last X-Forwarded-For entry, which Next sets from the connection when absent or a
 * reverse proxy in front appends. A client talking straight to Next can choose it, so the per-account limit is
 * the one that always holds; behind a proxy the per-address limit holds too.
 */
function clientAddress(headers: Record<string, unknown> | undefined): string | null {
  const forwarded = headers?.["x-forwarded-for"];
  const value = Array.isArray(forwarded) ? forwarded.join(",") : typeof forwarded === "string" ? forwarded : "";
  return value.split(",").map((part) => part.trim()).filter(Boolean).at(-1) ?? null;
}

/** next-auth configuration: e-mail + password, JWT sessions whose token carries the user id. */
export const authOptions: NextAuthOptions = {
  secret: process.env.NEXTAUTH_SECRET,
  session: { strategy: "jwt", maxAge: 14 * 24 * 60 * 60 },
  pages: { signIn: "/sign-in" },
  providers: [
    CredentialsProvider({
      name: "E-mail and password",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(credentials, request) {
        // Malformed input (a 100 kB e-mail, no password) is refused with what is wrong, before any count or hash.
        const parsed = signInSchema.safeParse(credentials);
        if (!parsed.success) throw new Error(`${SIGN_IN_REFUSED} ${[...new Set(parsed.error.issues.map((issue) => issue.message))].join(" ")}`);
        try {
          return await signInWithLimits({ ...parsed.data, address: clientAddress(request?.headers) });
        } catch (error) {
          // next-auth hands a thrown message to the sign-in form as the error.
          if (error instanceof TooManySignInsError) throw new Error(error.message);
          throw error;
        }
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      if (user) {
        token.userId = user.id;
        token.sessionVersion = (user as { sessionVersion?: number }).sessionVersion ?? 0;
      }
      return token;
    },
    async session({ session, token }) {
      if (token.userId) session.user = { ...session.user, id: token.userId, email: token.email ?? "", name: token.name ?? "" };
      session.sessionVersion = token.sessionVersion ?? 0;
      return session;
    },
  },
  events: {
    // Signing out ends the session for good, not just on this device's cookie jar: a copied cookie stops working.
    // With one version per user this ends the person's other sessions too (said on the sign-out button).
    async signOut({ token }) {
      if (token?.userId) await raiseSessionVersion({ userId: token.userId });
    },
  },
};
