import path from "node:path";
import { defineConfig } from "vitest/config";

const resolve = {
  alias: {
    "@": import.meta.dirname,
    "server-only": path.resolve(import.meta.dirname, "tests/helpers/server-only-stub.ts"),
  },
};

export default defineConfig({
  resolve,
  test: {
    projects: [
      {
        resolve,
        test: {
          name: "unit",
          include: ["tests/unit/**/*.test.ts"],
          environment: "node",
        },
      },
      {
        resolve,
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          globalSetup: ["tests/helpers/global-setup.ts"],
          // Integration files share one database; run them one after another.
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
          execArgv: ["--import", "tsx"],
        },
      },
    ],
  },
});
