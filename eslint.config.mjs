import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

// Layering (issue 12): db/ holds SQL only and lib/ computation never touches the database. Commands
// (lib/commands) and sign-in (lib/auth) are the lib/ code that may use db/. Type-only imports are allowed (no
// runtime coupling). The LEGACY lists are files still to be moved (their SQL into db/queries, their HTTP errors and
// mail into commands); the rule keeps new code from joining them, and each entry goes when its file is moved.
const LEGACY_LIB_USING_DB = [
  "lib/projects/schemas.ts",
  "lib/health.ts",
  "lib/http/route.ts",
  "lib/report/collect.ts",
  "lib/mail/outbox.ts",
  "lib/mail/notify.ts",
  "lib/mail/captured.ts",
  "lib/mail/digest.ts",
  "lib/mep/revision.ts",
  "lib/storage/attachments.ts",
  "lib/storage/model-files.ts",
];
const LEGACY_DB_USING_LIB = ["db/queries/projects.ts", "db/queries/comments.ts", "db/queries/invitations.ts"];

const config = [
  ...nextVitals,
  ...nextTs,
  {
    files: ["lib/**/*.ts", "lib/**/*.tsx"],
    ignores: ["lib/commands/**", "lib/auth/**", "**/*.test.ts", ...LEGACY_LIB_USING_DB],
    rules: {
      "no-restricted-imports": [
        "error",
        { patterns: [{ group: ["@/db/*", "**/db/*", "@/db"], allowTypeImports: true, message: "lib/ computation never uses the database: write a command in lib/commands, or pass the data in." }] },
      ],
    },
  },
  {
    files: ["db/**/*.ts"],
    ignores: LEGACY_DB_USING_LIB,
    rules: {
      "no-restricted-imports": [
        "error",
        {
          patterns: [
            {
              group: ["@/lib/mail/*", "@/lib/http/*", "@/lib/commands/*", "@/lib/clash/detect", "@/lib/analysis/*", "@/lib/review/*", "**/lib/mail/*", "**/lib/http/*"],
              allowTypeImports: true,
              message: "db/ holds SQL only: HTTP errors, mail and computation belong in the command that calls the query.",
            },
          ],
        },
      ],
    },
  },
  { ignores: [".next/**", "node_modules/**", ".data/**", ".artifacts/**", "drizzle/**", "next-env.d.ts"] },
];

export default config;
