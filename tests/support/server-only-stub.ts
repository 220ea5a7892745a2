// Vitest runs server modules outside Next.js, where "server-only" would throw; the guard matters only in bundles.
export {};
