// Every route handler under app/api goes through one of the wrappers of lib/http/route.ts (so none can skip the
// session, membership and rule-book checks), and none repeats the preamble by hand.
import { readdirSync, readFileSync } from "node:fs";
import { join, relative } from "node:path";
import { describe, expect, it } from "vitest";

const API = join(process.cwd(), "app/api");
const METHODS = ["GET", "HEAD", "POST", "PUT", "PATCH", "DELETE", "OPTIONS"];
// next-auth's own catch-all route is the sign-in machinery itself.
const EXEMPT = new Set(["auth/[...nextauth]/route.ts"]);
// What a hand-written preamble would import; the wrappers own these.
const PREAMBLE = ["@/lib/auth/guard", "getRequestUser", "handleRoute", "parseJson", "parseParams", "requireProjectRole"];

function routeFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) return routeFiles(path);
    return entry.name === "route.ts" ? [path] : [];
  });
}

/** Each exported HTTP method of a route file and the wrapper it is built with ("" when not a wrapper call). */
function exportedHandlers(source: string): { method: string; wrapper: string }[] {
  const handlers: { method: string; wrapper: string }[] = [];
  for (const match of source.matchAll(/export\s+(?:async\s+)?(?:const|function|let|var)\s+([A-Z]+)\b\s*(=\s*([A-Za-z]+)\s*\()?/g)) {
    if (METHODS.includes(match[1])) handlers.push({ method: match[1], wrapper: match[3] ?? "" });
  }
  for (const match of source.matchAll(/export\s*\{([^}]*)\}/g)) {
    for (const name of match[1].split(",").map((part) => part.trim().split(/\s+as\s+/).pop() ?? "")) {
      if (METHODS.includes(name)) handlers.push({ method: name, wrapper: "" });
    }
  }
  return handlers;
}

const files = routeFiles(API)
  .map((path) => ({ name: relative(API, path), source: readFileSync(path, "utf8") }))
  .filter((file) => !EXEMPT.has(file.name));

describe("route handlers", () => {
  it("finds the route files", () => {
    expect(files.length).toBeGreaterThan(20);
  });

  it.each(files.map((file) => [file.name, file.source]))("%s uses the route wrappers", (name, source) => {
    const handlers = exportedHandlers(source);
    expect(handlers.length).toBeGreaterThan(0);
    // Anything under a project goes through projectRoute (membership and the rule book); the rest is the person's own.
    const allowed = name.startsWith("projects/[projectId]/") ? ["projectRoute"] : ["projectRoute", "accountRoute", "publicRoute"];
    for (const handler of handlers) expect(allowed, `${handler.method} in ${name}`).toContain(handler.wrapper);
    for (const word of PREAMBLE) expect(source, `${name} repeats the preamble (${word})`).not.toContain(word);
  });

  it("recognises a handler that skips the wrappers", () => {
    expect(exportedHandlers("export const GET = handleRoute(async () => x);")).toEqual([{ method: "GET", wrapper: "handleRoute" }]);
    expect(exportedHandlers("export async function POST(request) {}")).toEqual([{ method: "POST", wrapper: "" }]);
    expect(exportedHandlers("export { handler as GET };")).toEqual([{ method: "GET", wrapper: "" }]);
    expect(exportedHandlers("export const PATCH = projectRoute({}, h);")).toEqual([{ method: "PATCH", wrapper: "projectRoute" }]);
  });
});
