// Cross-site request forgery guard for state-changing requests and realtime handshakes: a browser names the site a
// request comes from in Origin and (Fetch Metadata) Sec-Fetch-Site; anything from another site is refused. Clients
// that send neither (scripts, tests, server-to-server) are not browsers and carry no one else's cookies.
// No "server-only" marker: the realtime server checks its handshakes with the same rule.

/** Methods that change something; only these are checked (reads cannot be forged into writes). */
const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/**
 * The web app's own origins: APP_URL (set by the stack scripts) or NEXTAUTH_URL, and the address the request was
 * sent to (so http://localhost:3000 works as well as http://127.0.0.1:3000); a forging page controls neither.
 */
function ownOrigins(requestUrl: string): string[] {
  const configured = process.env.APP_URL ?? process.env.NEXTAUTH_URL;
  return [new URL(requestUrl).origin, ...(configured ? [new URL(configured).origin] : [])];
}

/** True unless the headers show a browser request made from another site than the given origins. */
export function isSameSite({ origin, secFetchSite }: { origin?: string | null; secFetchSite?: string | null }, allowed: readonly string[]): boolean {
  // "none" is a request the person started themselves (typed address, bookmark), never another page's.
  if (secFetchSite && secFetchSite !== "same-origin" && secFetchSite !== "none") return false;
  return origin == null || allowed.includes(origin);
}

/** True when a route handler's request may change something: a safe method, or sent from the app's own pages. */
export function mayChangeFrom(request: Request): boolean {
  if (SAFE_METHODS.has(request.method)) return true;
  return isSameSite({ origin: request.headers.get("origin"), secFetchSite: request.headers.get("sec-fetch-site") }, ownOrigins(request.url));
}
