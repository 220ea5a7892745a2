// next-auth's session and JWT carry the user id (style.md, "Authorisation").
import type { DefaultSession } from "next-auth";

declare module "next-auth" {
  interface Session {
    user: { id: string; email: string; name: string } & Omit<NonNullable<DefaultSession["user"]>, "email" | "name">;
  }
}

declare module "next-auth/jwt" {
  interface JWT {
    userId?: string;
  }
}
