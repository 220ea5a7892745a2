// The route files under app/api and the methods each exports, read from the sources, for tests that aim at every
// route over HTTP (a new route file is covered without a new test).
import { readdirSync, readFileSync } from "node:fs";
import { join, relative } from "node:path";

export const HTTP_METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;
export type ApiRoute = { file: string; url: string; segments: string[]; methods: Set<string> };

const API = join(process.cwd(), "app/api");

function routeFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) return routeFiles(path);
    return entry.name === "route.ts" ? [path] : [];
  });
}

/** `export const GET = …` and `export { handler as GET }` (next-auth's catch-all). */
function exportedMethods(source: string): Set<string> {
  const methods = new Set<string>();
  for (const match of source.matchAll(/export\s+(?:const|async\s+function|function)\s+([A-Z]+)\b/g)) methods.add(match[1]);
  for (const list of source.matchAll(/export\s*\{([^}]*)\}/g)) for (const match of list[1].matchAll(/\bas\s+([A-Z]+)\b/g)) methods.add(match[1]);
  return new Set([...methods].filter((method) => (HTTP_METHODS as readonly string[]).includes(method)));
}

export function apiRoutes(): ApiRoute[] {
  return routeFiles(API).map((path) => {
    const file = relative(API, path);
    const url = `/api/${file.replace(/\/?route\.ts$/, "")}`;
    return { file, url, segments: [...url.matchAll(/\[([^\]]+)\]/g)].map((m) => m[1]), methods: exportedMethods(readFileSync(path, "utf8")) };
  });
}
