import { defineConfig } from "vitest/config";

export default defineConfig({
  test: {
    include: ["tests/**/*.test.ts"],
    environment: "node",
    // Several tests start real processes, worker threads or a browser; on a loaded two-core
    // machine the default 5 s is too short for them.
    testTimeout: 30_000,
    reporters: ["default", "json"],
    outputFile: { json: ".vitest-report.json" },
  },
});
