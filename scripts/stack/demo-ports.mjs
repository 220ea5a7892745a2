// Fixed loopback ports for `npm start`, each overridable by an environment variable.
export function demoPorts() {
  const port = (name, fallback) => Number(process.env[name] ?? fallback);
  return {
    web: port("PORT", 3000),
    postgres: port("STRUTROOM_PG_PORT", 54329),
    realtime: port("STRUTROOM_REALTIME_PORT", 3001),
    jobs: port("STRUTROOM_JOBS_PORT", 3002),
    s3: port("STRUTROOM_S3_PORT", 4569),
    smtp: port("STRUTROOM_SMTP_PORT", 2525),
    // Only `npm run start:cluster` uses these: Redis, and the second web, realtime and jobs process.
    redis: port("STRUTROOM_REDIS_PORT", 6390),
    web2: port("STRUTROOM_WEB2_PORT", 3010),
    realtime2: port("STRUTROOM_REALTIME2_PORT", 3011),
    jobs2: port("STRUTROOM_JOBS2_PORT", 3012),
  };
}
