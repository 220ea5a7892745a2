// Hole 8: no security headers. Every page gets a Content-Security-Policy with a fresh nonce for Next's scripts
// (Next's "Content Security Policy" guide: the proxy sets it on the request, where Next reads the nonce, and on the
// response), the realtime and object-storage origins in connect-src, worker-src for the analysis worker, and
// frame-ancestors 'none'; every response gets nosniff and a Referrer-Policy and no X-Powered-By. The browser tests
// run under this policy and fail on any violation (tests/support/browser.ts).
import { NextRequest } from "next/server";
import { describe, expect, it } from "vitest";
import nextConfig from "@/next.config";
import { proxy } from "@/proxy";

function directives(policy: string): Map<string, string[]> {
  return new Map(policy.split(";").map((part) => part.trim().split(/\s+/)).map(([name, ...values]) => [name, values]));
}

async function pagePolicy(path: string) {
  const response = await proxy(new NextRequest(new URL(path, "http://127.0.0.1")));
  const policy = response.headers.get("content-security-policy");
  expect(policy, `policy on ${path}`).toBeTruthy();
  // NextResponse.next({ request: { headers } }) passes request headers on as x-middleware-request-*.
  expect(response.headers.get("x-middleware-request-content-security-policy")).toBe(policy);
  return { policy: directives(policy!), nonce: response.headers.get("x-middleware-request-x-nonce")! };
}

describe("Content-Security-Policy", () => {
  it("sets a fresh nonce on every page and allows only nonced scripts", async () => {
    const first = await pagePolicy("/sign-in");
    const second = await pagePolicy("/sign-in");
    expect(first.nonce).toMatch(/^[A-Za-z0-9+/=]{16,}$/);
    expect(second.nonce).not.toBe(first.nonce);
    const script = first.policy.get("script-src")!;
    expect(script).toContain(`'nonce-${first.nonce}'`);
    expect(script).not.toContain("'unsafe-inline'");
    expect(script).not.toContain("'unsafe-eval'");
    expect(first.policy.get("object-src")).toEqual(["'none'"]);
    expect(first.policy.get("frame-ancestors")).toEqual(["'none'"]);
    expect(first.policy.get("base-uri")).toEqual(["'self'"]);
  });

  it("lets the app reach the realtime server, object storage and its workers", async () => {
    const { policy } = await pagePolicy("/sign-in");
    const realtime = new URL(process.env.REALTIME_URL!).origin;
    expect(policy.get("connect-src")).toEqual(expect.arrayContaining(["'self'", realtime, realtime.replace(/^http/, "ws"), new URL(process.env.S3_ENDPOINT!).origin]));
    expect(policy.get("worker-src")).toContain("'self'");
  });

  it("covers signed-in pages too, and still sends signed-out visitors to sign in", async () => {
    const redirect = await proxy(new NextRequest("http://127.0.0.1/projects"));
    expect(redirect.status).toBe(307);
    expect(new URL(redirect.headers.get("location")!).pathname).toBe("/sign-in");
    expect((await pagePolicy("/join/some-token")).policy.get("frame-ancestors")).toEqual(["'none'"]);
  });
});

describe("headers on every response", () => {
  it("nosniff, a Referrer-Policy, no framing, no X-Powered-By", async () => {
    expect(nextConfig.poweredByHeader).toBe(false);
    const rules = await nextConfig.headers!();
    const all = rules.find((rule) => rule.source === "/:path*");
    const headers = new Map(all!.headers.map(({ key, value }) => [key.toLowerCase(), value]));
    expect(headers.get("x-content-type-options")).toBe("nosniff");
    expect(headers.get("referrer-policy")).toBe("strict-origin-when-cross-origin");
    expect(headers.get("x-frame-options")).toBe("DENY");
  });
});
