import "@fontsource/barlow/400.css";
import "@fontsource/barlow/500.css";
import "@fontsource/barlow/600.css";
import "@fontsource/barlow/700.css";
import "./app.css";
import { useEffect } from "react";
import {
  data,
  isRouteErrorResponse,
  Links,
  Meta,
  Outlet,
  Scripts,
  ScrollRestoration,
  useRouteLoaderData,
} from "react-router";
import type { Route } from "./+types/root";
import { AppShell } from "~/components/app-shell";
import { OfflineBanner } from "~/components/offline-banner";
import { startSending } from "~/offline/outbox";
import { registerWorker } from "~/offline/register-worker";
import { useCspNonce } from "~/utils/csp-nonce";
import { securityMiddleware } from "~/utils/security.server";
import { readFlash, getUser } from "~/utils/session.server";
import { pageReadsMiddleware } from "~/utils/page-reads.server";

// First on every request: refuses cross-site mutations before any action and sets the security headers; then a page's
// loaders share one read of the session user.
export const middleware: Route.MiddlewareFunction[] = [securityMiddleware, pageReadsMiddleware];

export const meta: Route.MetaFunction = () => [{ title: "Plumbline" }];

export const links: Route.LinksFunction = () => [
  { rel: "icon", href: "/favicon.svg", type: "image/svg+xml" },
  { rel: "manifest", href: "/manifest.webmanifest" },
  { rel: "apple-touch-icon", href: "/icon-192.png" },
];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await getUser(request);
  const flash = await readFlash(request);
  return data(
    { user, flash: flash.message },
    flash.setCookie ? { headers: { "Set-Cookie": flash.setCookie } } : undefined,
  );
}

export function Layout({ children }: { children: React.ReactNode }) {
  const rootData = useRouteLoaderData<typeof loader>("root");
  const nonce = useCspNonce();
  useEffect(() => {
    document.documentElement.dataset.hydrated = "true";
  }, []);
  // Installable and usable without signal: the service worker keeps the shell and kept plans, the outbox sends
  // what was saved on the phone.
  useEffect(() => {
    registerWorker();
    startSending();
  }, []);
  return (
    <html lang="en-GB">
      <head>
        <meta charSet="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <meta name="theme-color" content="#2f5d7c" />
        {/* zod probes `new Function` when it builds its first object schema; the CSP refuses that and reports it as
            a violation, so zod is told to go without before any module runs. */}
        <script
          nonce={nonce}
          suppressHydrationWarning
          dangerouslySetInnerHTML={{ __html: "globalThis.__zod_globalConfig={jitless:true};" }}
        />
        <Meta />
        {/* Stylesheets and icons need no nonce (style-src allows inline styles, links are same-origin). An empty one stops
            React Router giving them the script nonce, which the browser hides from the page, so hydration saw a mismatch. */}
        <Links nonce="" />
      </head>
      <body className="min-h-screen">
        <OfflineBanner />
        <AppShell user={rootData?.user ?? null} flash={rootData?.flash ?? null}>
          {children}
        </AppShell>
        <ScrollRestoration />
        <Scripts />
      </body>
    </html>
  );
}

export default function App() {
  return <Outlet />;
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  let title = "Something went wrong";
  let detail = "The page could not be shown. Try again; if it keeps happening, tell your admin what you were doing.";
  if (isRouteErrorResponse(error)) {
    const message =
      typeof error.data === "object" && error.data && "message" in error.data ? String(error.data.message) : null;
    if (error.status === 403) {
      title = "Not for your role";
      detail = message ?? "Your roles do not include this page.";
    } else if (error.status === 404) {
      title = "Not found";
      detail = message ?? "There is nothing at this address in your organisation.";
    } else {
      title = `${error.status} ${error.statusText}`;
      detail = message ?? (typeof error.data === "string" ? error.data : detail);
    }
  } else if (import.meta.env.DEV && error instanceof Error) {
    detail = error.message;
  }
  return (
    <section className="mx-auto max-w-xl py-12" role="alert">
      <h1>{title}</h1>
      <p className="mt-3 text-ink-soft">{detail}</p>
      <p className="mt-6">
        <a href="/">Back to the dashboard</a>
      </p>
    </section>
  );
}
