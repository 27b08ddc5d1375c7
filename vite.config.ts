/// <reference types="vitest/config" />
import { reactRouter } from "@react-router/dev/vite";
import tailwindcss from "@tailwindcss/vite";
import { defineConfig } from "vite";

export default defineConfig({
  plugins: [tailwindcss(), !process.env.VITEST && reactRouter()],
  resolve: { tsconfigPaths: true },
  environments: {
    // The server build's entry is our production server (React Router's node-custom-server layout): it imports the
    // app as "virtual:react-router/server-build" and comes out as build/server/index.js, run with plain node.
    ssr: {
      build: { rollupOptions: { input: "app/utils/serve.server.ts" } },
      // Bundled so the server loads only the unit code utils/quantities.ts uses, not all of mathjs's thousand modules
      // (seconds at each worker's start). Not under vitest, which would transform them all instead.
      resolve: { noExternal: process.env.VITEST ? [] : ["mathjs"] },
    },
  },
  server: { watch: { ignored: ["**/data/**", "**/build/**", "**/test-results/**"] } },
  test: {
    pool: "forks",
    testTimeout: 20000,
    projects: [
      {
        extends: true,
        test: {
          name: "unit",
          include: ["app/**/*.test.ts", "db/**/*.test.ts", "tests/integration/**/*.test.ts"],
          setupFiles: ["tests/support/database.ts"],
        },
      },
      {
        extends: true,
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.e2e.ts"],
          globalSetup: ["tests/e2e/global-setup.ts"],
          testTimeout: 60000,
          hookTimeout: 120000,
          fileParallelism: false,
        },
      },
    ],
  },
});
