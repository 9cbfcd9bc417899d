import { defineConfig } from "vitest/config";

export default defineConfig({
  resolve: { tsconfigPaths: true },
  test: {
    include: ["tests/unit/**/*.test.ts", "tests/engine/**/*.test.ts", "tests/integration/**/*.test.ts"],
    environment: "node",
    // Integration tests share one test database; files run one after another.
    fileParallelism: false,
    setupFiles: ["tests/setup.ts"],
    testTimeout: 30_000,
    hookTimeout: 60_000,
    server: { deps: { inline: ["server-only"] } },
    alias: { "server-only": new URL("./tests/support/empty.ts", import.meta.url).pathname },
  },
});
