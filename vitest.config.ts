import { defineConfig } from "vitest/config";
import path from "node:path";

// "server-only" throws outside React Server Components; in tests the guarded modules run in plain Node.
const alias = {
  "@": path.resolve(import.meta.dirname),
  "server-only": path.resolve(import.meta.dirname, "tests/fixtures/empty-module.ts"),
};

export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: { name: "unit", include: ["tests/unit/**/*.test.ts"], environment: "node" },
      },
      {
        resolve: { alias },
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          // One MariaDB test database: files run one after another so each starts from a known state.
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
          setupFiles: ["tests/integration/setup.ts"],
        },
      },
      {
        resolve: { alias },
        // Whole processes: production app servers (needs `npm run build` first), workers, private
        // MariaDB instances that get killed. scripts/test.sh runs these after the build.
        test: {
          name: "system",
          include: ["tests/system/**/*.test.ts"],
          environment: "node",
          fileParallelism: false,
          testTimeout: 600_000,
          hookTimeout: 300_000,
        },
      },
    ],
  },
});
