/// <reference types="vitest/config" />
import { reactRouter } from "@react-router/dev/vite";
import tailwindcss from "@tailwindcss/vite";
import { defineConfig } from "vite";

export default defineConfig({
  plugins: [tailwindcss(), !process.env.VITEST && reactRouter()],
  resolve: { tsconfigPaths: true },
  server: { watch: { ignored: ["**/data/**", "**/build/**", "**/test-results/**"] } },
  test: {
    include: ["app/**/*.test.ts", "app/**/*.test.tsx", "db/**/*.test.ts", "tests/integration/**/*.test.ts"],
    environment: "node",
    pool: "forks",
    globalSetup: [],
    testTimeout: 20000,
  },
});
