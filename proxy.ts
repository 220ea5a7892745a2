// Runs before every page: sets the Content-Security-Policy with a fresh nonce (Next reads it from the request's
// policy header and puts it on its own scripts), and sends signed-out visitors of app pages to the sign-in page.
// The redirect is only a convenience, not the security boundary: every page, route handler, server action and
// socket event checks the session and the permission table itself.
import { getToken } from "next-auth/jwt";
import { NextResponse, type NextRequest } from "next/server";
import { contentSecurityPolicy } from "@/lib/http/csp";

const SIGNED_IN_ONLY = /^\/(projects|account)(\/|$)/;

function policyFor(nonce: string): string {
  return contentSecurityPolicy({
    nonce,
    development: process.env.NODE_ENV === "development",
    realtimeUrl: process.env.REALTIME_URL,
    storageUrl: process.env.S3_ENDPOINT,
  });
}

export async function proxy(request: NextRequest) {
  if (SIGNED_IN_ONLY.test(request.nextUrl.pathname) && !(await getToken({ req: request, secret: process.env.NEXTAUTH_SECRET }))) {
    const signIn = new URL("/sign-in", request.url);
    signIn.searchParams.set("callbackUrl", request.nextUrl.pathname + request.nextUrl.search);
    return NextResponse.redirect(signIn);
  }
  const nonce = Buffer.from(crypto.randomUUID()).toString("base64");
  const policy = policyFor(nonce);
  const headers = new Headers(request.headers);
  headers.set("x-nonce", nonce);
  headers.set("content-security-policy", policy);
  const response = NextResponse.next({ request: { headers } });
  response.headers.set("content-security-policy", policy);
  return response;
}

export const config = {
  // Pages only: not route handlers, not Next's static files, and not link prefetches (they reuse the page's policy).
  matcher: [
    {
      source: "/((?!api|_next/static|_next/image|favicon.ico|icon.svg|apple-touch-icon.png|manifest.webmanifest).*)",
      missing: [
        { type: "header", key: "next-router-prefetch" },
        { type: "header", key: "purpose", value: "prefetch" },
      ],
    },
  ],
};
