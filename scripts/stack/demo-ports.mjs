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
  };
}
