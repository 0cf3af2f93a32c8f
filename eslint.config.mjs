import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";
import drizzle from "eslint-plugin-drizzle";

// The pure cores (mechanics solver, review workflow) import no framework, database or I/O.
const pureCore = {
  patterns: [
    { group: ["react", "react-dom", "react/*", "next", "next/*", "next-auth", "next-auth/*"], message: "lib/solver and lib/workflow stay free of React and Next." },
    { group: ["@/db", "@/db/*", "drizzle-orm", "drizzle-orm/*", "mysql2", "mysql2/*"], message: "lib/solver and lib/workflow do not touch the database." },
    { group: ["fs", "node:fs", "fs/*", "node:fs/*", "node:child_process", "child_process"], message: "No I/O in the pure cores." },
  ],
};

const config = [
  ...nextVitals,
  ...nextTs,
  {
    ignores: [".next/**", ".next-*/**", "public/**", "node_modules/**", ".data/**", "drizzle/**", "test-results/**", "playwright-report/**", "next-env.d.ts"],
  },
  {
    files: ["lib/solver/**/*.ts", "lib/workflow/**/*.ts"],
    rules: { "no-restricted-imports": ["error", pureCore] },
  },
  {
    plugins: { drizzle },
    rules: {
      // Every update and delete names its rows.
      "drizzle/enforce-delete-with-where": ["error", { drizzleObjectName: ["db", "tx", "database"] }],
      "drizzle/enforce-update-with-where": ["error", { drizzleObjectName: ["db", "tx", "database"] }],
    },
  },
  {
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
      // No React Compiler here; TanStack Table's hook is fine without memoization.
      "react-hooks/incompatible-library": "off",
    },
  },
];

export default config;
