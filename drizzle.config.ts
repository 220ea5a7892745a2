import { defineConfig } from "drizzle-kit";

// drizzle-kit reads the schema to generate migrations into ./drizzle; DATABASE_URL is only needed for push/studio.
export default defineConfig({
  schema: "./db/schema/index.ts",
  out: "./drizzle",
  dialect: "postgresql",
  dbCredentials: { url: process.env.DATABASE_URL ?? "postgres://localhost/strutroom" },
  casing: "snake_case",
});
