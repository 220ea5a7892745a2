import "server-only";

/** Where browsers reach the realtime process (set by scripts/stack/services.mjs); read by the pages that connect. */
export function realtimeUrl(): string {
  const url = process.env.REALTIME_URL;
  if (!url) throw new Error("REALTIME_URL is not set.");
  return url;
}
