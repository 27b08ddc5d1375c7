import type { Config } from "@react-router/dev/config";

export default {
  ssr: true,
  // Every v8 flag is decided here, so the build prints no future-flag warnings.
  future: {
    unstable_optimizeDeps: true,
    v8_middleware: true,
    v8_splitRouteModules: true,
    v8_viteEnvironmentApi: true,
    v8_trailingSlashAwareDataRequests: true,
    // Not yet: loaders and the session guard read `request.url` (sign-in's redirectTo, search parameters), which
    // would then carry the `.data` suffix of client navigations; they must move to the `url` argument first.
    v8_passThroughRequests: false,
  },
  // Cross-site mutations are refused by the root middleware (app/utils/security.server.ts), which runs before every
  // action, resource routes included, answers 403 with a sentence and also accepts PUBLIC_URL's origin (behind a
  // TLS proxy the request URL says http). React Router's own check would answer a bare 400 first for pages only,
  // and only knows origins at build time, so it is handed every host here and the middleware decides.
  allowedActionOrigins: ["**"],
} satisfies Config;
