// The Content-Security-Policy of every page (proxy.ts sets it with a fresh nonce per request; Next puts the nonce
// on its own scripts, see Next's "Content Security Policy" guide). Pure: the origins come from the caller.

export type PolicyInput = {
  nonce: string;
  /** `next dev` needs eval for its refresh runtime; production never gets it. */
  development: boolean;
  /** The realtime server (socket.io and Yjs), e.g. http://127.0.0.1:3001. */
  realtimeUrl?: string;
  /** Object storage the browser uploads to and downloads from through presigned URLs. */
  storageUrl?: string;
};

/** http(s) origin and its ws(s) twin, for connect-src. */
function connectOrigins(url: string | undefined): string[] {
  if (!url) return [];
  const origin = new URL(url).origin;
  return [origin, origin.replace(/^http/, "ws")];
}

export function contentSecurityPolicy({ nonce, development, realtimeUrl, storageUrl }: PolicyInput): string {
  const directives: Record<string, string[]> = {
    "default-src": ["'self'"],
    // 'strict-dynamic': scripts Next's nonced scripts load (route chunks) may run; nothing else.
    "script-src": ["'self'", `'nonce-${nonce}'`, "'strict-dynamic'", ...(development ? ["'unsafe-eval'"] : [])],
    // React style attributes (the viewer's panels, progress bars) need inline styles; styles cannot run code.
    "style-src": ["'self'", "'unsafe-inline'"],
    // The 3D viewer draws to a WebGL canvas (no directive governs WebGL) and reads textures from blob: and data:;
    // attached images are shown from object storage through presigned URLs.
    "img-src": ["'self'", "blob:", "data:", ...(storageUrl ? [new URL(storageUrl).origin] : [])],
    "font-src": ["'self'", "data:"],
    "connect-src": ["'self'", ...connectOrigins(realtimeUrl), ...(storageUrl ? [new URL(storageUrl).origin] : [])],
    // The analysis and what-if Web Workers are bundled files of the app.
    "worker-src": ["'self'", "blob:"],
    "object-src": ["'none'"],
    "base-uri": ["'self'"],
    "form-action": ["'self'"],
    "frame-ancestors": ["'none'"],
  };
  return Object.entries(directives)
    .map(([name, values]) => `${name} ${values.join(" ")}`)
    .join("; ");
}
