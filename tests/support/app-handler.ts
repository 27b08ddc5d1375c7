// The whole app as React Router serves it, in the test process: every route of app/routes.ts under root.tsx,
// the custom entry.server.tsx and the future flags of react-router.config.ts, so a Request goes through the
// root middleware, React Router's own checks and the document render, as it does under the production server (app/utils/serve.server.ts).
import path from "node:path";
import type { RouteConfigEntry } from "@react-router/dev/routes";
import {
  createRequestHandler,
  UNSAFE_withComponentProps,
  UNSAFE_withErrorBoundaryProps,
  UNSAFE_withHydrateFallbackProps,
  type ServerBuild,
} from "react-router";
import * as entryServer from "~/entry.server";
import * as root from "~/root";
import routeConfig from "~/routes";
import config from "../../react-router.config";

type ServerRoutes = ServerBuild["routes"];
type ManifestRoutes = ServerBuild["assets"]["routes"];
type RouteModule = NonNullable<ServerRoutes[string]>["module"];

function manifestEntry(
  id: string,
  parentId: string | undefined,
  entry: Pick<RouteConfigEntry, "path" | "index">,
  module: RouteModule,
) {
  return {
    id,
    parentId,
    path: entry.path,
    index: entry.index,
    hasAction: typeof module.action === "function",
    hasLoader: typeof module.loader === "function",
    hasClientAction: false,
    hasClientLoader: false,
    hasClientMiddleware: false,
    hasErrorBoundary: typeof module.ErrorBoundary === "function",
    module: `/assets/${id}.js`,
    imports: [],
    css: [],
    clientActionModule: undefined,
    clientLoaderModule: undefined,
    clientMiddlewareModule: undefined,
    hydrateFallbackModule: undefined,
  };
}

/** What React Router's Vite plugin does to a route module: its components get loaderData, params and so on as props. */
function asBuilt(module: Record<string, unknown>): RouteModule {
  const built: Record<string, unknown> = { ...module };
  type Component = Parameters<typeof UNSAFE_withComponentProps>[0];
  if (module.default) built.default = UNSAFE_withComponentProps(module.default as Component);
  if (module.ErrorBoundary)
    built.ErrorBoundary = UNSAFE_withErrorBoundaryProps(
      module.ErrorBoundary as Parameters<typeof UNSAFE_withErrorBoundaryProps>[0],
    );
  if (module.HydrateFallback)
    built.HydrateFallback = UNSAFE_withHydrateFallbackProps(
      module.HydrateFallback as Parameters<typeof UNSAFE_withHydrateFallbackProps>[0],
    );
  return built as unknown as RouteModule;
}

async function addRoutes(
  entries: RouteConfigEntry[],
  parentId: string,
  routes: ServerRoutes,
  manifest: ManifestRoutes,
) {
  for (const entry of entries) {
    const id = entry.id ?? entry.file.replace(/\.[jt]sx?$/, "");
    const module = asBuilt(await import(path.resolve("app", entry.file)));
    routes[id] = { id, parentId, path: entry.path, index: entry.index, caseSensitive: entry.caseSensitive, module };
    manifest[id] = manifestEntry(id, parentId, entry, module);
    if (entry.children) await addRoutes(entry.children, id, routes, manifest);
  }
}

/** A request handler for the app; script and style URLs in the documents it renders point nowhere. */
export async function createAppHandler(): Promise<(request: Request) => Promise<Response>> {
  const rootModule = asBuilt(root);
  const routes: ServerRoutes = { root: { id: "root", path: "", module: rootModule } };
  const manifest: ManifestRoutes = { root: manifestEntry("root", undefined, { path: "" }, rootModule) };
  await addRoutes(routeConfig, "root", routes, manifest);
  const build: ServerBuild = {
    entry: { module: entryServer as unknown as ServerBuild["entry"]["module"] },
    routes,
    assets: {
      entry: { module: "/assets/entry.client.js", imports: [] },
      routes: manifest,
      url: "/assets/manifest.js",
      version: "test",
    },
    basename: "/",
    publicPath: "/",
    assetsBuildDirectory: "build/client",
    future: config.future,
    ssr: true,
    isSpaMode: false,
    prerender: [],
    routeDiscovery: { mode: "lazy", manifestPath: "/__manifest" },
    allowedActionOrigins: config.allowedActionOrigins ?? false,
  };
  const handler = createRequestHandler(build, "test");
  return (request) => handler(request);
}
