/// <reference types="vitest/config" />
import { reactRouter } from "@react-router/dev/vite";
import tailwindcss from "@tailwindcss/vite";
import { fileURLToPath } from "node:url";
import { defineConfig } from "vite";

/**
 * react-router 7.18 names only its development build in its package exports (dist/development: dev warnings, extra
 * checks), whatever NODE_ENV says. A production build takes dist/production instead, on the server and in the
 * browser; the server bundles React Router's Node and Express adapters with it, so every part of the server uses the
 * one copy. `react-router dev` and vitest keep the development build.
 */
const reactRouterProduction = (file: string) =>
  fileURLToPath(new URL(`./node_modules/react-router/dist/production/${file}`, import.meta.url));
const productionReactRouter = [
  { find: /^react-router$/, replacement: reactRouterProduction("index.mjs") },
  { find: /^react-router\/dom$/, replacement: reactRouterProduction("dom-export.mjs") },
];

export default defineConfig(({ command, mode }) => ({
  plugins: [tailwindcss(), !process.env.VITEST && reactRouter()],
  resolve: {
    tsconfigPaths: true,
    alias: command === "build" && mode === "production" && !process.env.VITEST ? productionReactRouter : [],
  },
  environments: {
    // The server build's entry is our production server (React Router's node-custom-server layout): it imports the
    // app as "virtual:react-router/server-build" and comes out as build/server/index.js, run with plain node.
    ssr: {
      build: { rollupOptions: { input: "app/utils/serve.server.ts" } },
      // Bundled so the server loads only the unit code utils/quantities.ts uses, not all of mathjs's thousand modules
      // (seconds at each worker's start). Not under vitest, which would transform them all instead.
      resolve: {
        noExternal: process.env.VITEST ? [] : ["mathjs", "react-router", "@react-router/node", "@react-router/express"],
      },
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
        // The integration tests again, each file on a database of its own on a throwaway PostgreSQL server.
        extends: true,
        test: {
          name: "postgres",
          include: ["tests/integration/**/*.test.ts"],
          setupFiles: ["tests/support/database.ts"],
          globalSetup: ["tests/support/postgres-setup.ts"],
          hookTimeout: 60000,
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
}));
