import { defineConfig } from "vitest/config";

export default defineConfig({
  test: {
    include: ["test/**/*.test.ts"],
    testTimeout: 60_000,
    // dist/ (the compiled library that bin/dotspec.js runs) is rebuilt before the tests.
    globalSetup: ["test/helpers/buildDist.ts"],
    benchmark: { include: ["bench/**/*.bench.ts"] },
  },
});
