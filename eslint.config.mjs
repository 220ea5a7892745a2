import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

// Layering (issue 12): db/ holds SQL only and lib/ computation never touches the database. Commands
// (lib/commands) and sign-in (lib/auth) are the lib/ code that may use db/; other lib/ files import
// nothing of it. db/queries and db/client import nothing, not even a type, from HTTP, mail, commands or
// computation: their types come from the stored columns (db/schema).
const NOT_IN_DB = ["mail", "http", "commands", "clash", "review", "analysis"];

const config = [
  ...nextVitals,
  ...nextTs,
  {
    files: ["lib/**/*.ts", "lib/**/*.tsx"],
    ignores: ["lib/commands/**", "lib/auth/**", "**/*.test.ts"],
    rules: {
      "no-restricted-imports": [
        "error",
        { patterns: [{ group: ["@/db/*", "**/db/*", "@/db"], message: "lib/ computation never uses the database, not even its types: write a command in lib/commands, or pass the data in." }] },
      ],
    },
  },
  {
    files: ["db/queries/**/*.ts", "db/client.ts"],
    rules: {
      "no-restricted-imports": [
        "error",
        {
          patterns: [
            {
              group: NOT_IN_DB.flatMap((folder) => [`@/lib/${folder}`, `@/lib/${folder}/*`, `**/lib/${folder}`, `**/lib/${folder}/*`]),
              message: "db/queries holds SQL only: HTTP errors, mail and computation belong in the command that calls the query; type jsonb by the db/schema columns.",
            },
          ],
        },
      ],
    },
  },
  {
    // The schema names the stored vocabulary (lib/clash/outcomes, roles, …) and types jsonb by its format; it runs nothing.
    files: ["db/schema/**/*.ts"],
    rules: {
      "no-restricted-imports": [
        "error",
        {
          patterns: [
            {
              group: ["mail", "http", "commands", "review", "analysis"].flatMap((folder) => [`@/lib/${folder}/*`, `**/lib/${folder}/*`]).concat(["@/lib/clash/detect", "**/lib/clash/detect"]),
              allowTypeImports: true,
              message: "db/schema declares tables only: no HTTP errors, mail, commands or computation.",
            },
          ],
        },
      ],
    },
  },
  { ignores: [".next/**", "node_modules/**", ".data/**", ".artifacts/**", ".build/**", "drizzle/**", "next-env.d.ts"] },
];

export default config;
