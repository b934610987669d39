// Lint: TypeScript rules plus the project's two import boundaries.
import js from "@eslint/js";
import tseslint from "typescript-eslint";

const FRAMEWORKS_AND_DATABASE = [
  { group: ["next", "next/*", "react", "react/*", "react-dom", "react-dom/*", "next-auth", "next-auth/*"], message: "lib/calc is the engineering library: pure TypeScript with no framework imports, so it can be tested and reused anywhere." },
  { group: ["@prisma/*", "**/db/*", "**/db", "@/lib/db/*"], message: "lib/calc never touches the database: callers pass plain values in and store what it returns." },
];

const PRISMA_OUTSIDE_DB = [
  { group: ["@prisma/*", "**/db/client", "**/db/generated", "**/db/generated/*", "**/db/generated-postgresql/*", "@/lib/db/client", "@/lib/db/generated/*", "@/lib/db/generated-postgresql/*"], message: "Only lib/db/* talks to Prisma. Add a query or mutation in lib/db and import that instead." },
];

export default tseslint.config(
  { ignores: ["node_modules/**", ".next/**", "lib/db/generated/**", "lib/db/generated-postgresql/**", "next-env.d.ts", "test-results/**", "playwright-report/**", "data/**"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
      "@typescript-eslint/consistent-type-imports": ["error", { fixStyle: "inline-type-imports" }],
    },
  },
  {
    // Reference tables quote published values to the digits printed, even beyond double precision.
    files: ["**/*.test.ts"],
    rules: { "no-loss-of-precision": "off" },
  },
  {
    files: ["lib/calc/**/*.ts"],
    rules: { "no-restricted-imports": ["error", { patterns: FRAMEWORKS_AND_DATABASE }] },
  },
  {
    files: ["**/*.ts", "**/*.tsx", "**/*.mjs"],
    ignores: ["lib/db/**", "lib/calc/**", "prisma.config.ts", "prisma/postgresql/cli-adapter.ts", "test/support/**", "test/global-setup.ts"],
    rules: { "no-restricted-imports": ["error", { patterns: PRISMA_OUTSIDE_DB }] },
  },
  {
    // App code reads the database through lib/db's Prisma client only; raw better-sqlite3 is for bench/ fixtures,
    // scripts/ and test checks.
    files: ["app/**/*.ts", "app/**/*.tsx", "lib/**/*.ts", "proxy.ts"],
    ignores: ["lib/db/**", "lib/calc/**"],
    rules: {
      "no-restricted-imports": [
        "error",
        { patterns: [...PRISMA_OUTSIDE_DB, { group: ["better-sqlite3"], message: "App code goes through lib/db (Prisma); better-sqlite3 directly is for bench/ and scripts/." }] },
      ],
    },
  },
);
