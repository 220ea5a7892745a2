// next-auth's session and JWT carry the user id (style.md, "Authorisation").
import type { DefaultSession } from "next-auth";

declare module "next-auth" {
  interface Session {
    user: { id: string; email: string; name: string } & Omit<NonNullable<DefaultSession["user"]>, "email" | "name">;
    /** The session version it was issued under (checked against the user's current one on every request). */
    sessionVersion: number;
  }
}

declare module "next-auth/jwt" {
  interface JWT {
    userId?: string;
    /** The user's session version when this session was issued (db/schema users.sessionVersion). */
    sessionVersion?: number;
  }
}
