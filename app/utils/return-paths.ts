import { matchPath } from "react-router";

/**
 * The pages a visitor may be sent back to after signing in: every pattern of app/routes.ts but the sign-in and
 * sign-out pages and the JSON API (tests/integration/redirects.test.ts keeps this list equal to the route config).
 */
export const RETURN_PATHS = [
  "/",
  "/forgot-password",
  "/set-password/:token",
  "/settings",
  "/reference",
  "/verify/:token",
  "/sites",
  "/sites/new",
  "/sites/:siteId",
  "/jobs",
  "/jobs/new",
  "/jobs/:jobId",
  "/jobs/:jobId/edit",
  "/components",
  "/components/new",
  "/components/:componentId",
  "/components/:componentId/edit",
  "/gear",
  "/gear/new",
  "/gear/import",
  "/gear/export.csv",
  "/gear/:itemId",
  "/gear/:itemId/edit",
  "/files/:fileId",
  "/admin",
  "/admin/users/new",
  "/admin/users/:userId",
  "/admin/settings",
  "/admin/outbox",
  "/admin/outbox/:mailId",
  "/plans/new",
  "/plans/:planId",
  "/plans/:planId/edit",
  "/plans/:planId/details",
  "/plans/:planId/submit",
  "/plans/:planId/review",
  "/plans/:planId/history",
  "/plans/:planId/lift",
  "/plans/:planId/lift-record.pdf",
  "/plans/:planId/print",
  "/plans/:planId/print.pdf",
] as const;

/** Route patterns left out of RETURN_PATHS on purpose. */
export const NOT_RETURN_PATHS = ["/login", "/logout", "/api/*"] as const;

/** Whether `pathname` (already parsed) is one of Plumbline's pages. */
export function isReturnPath(pathname: string): boolean {
  return RETURN_PATHS.some((pattern) => matchPath({ path: pattern, end: true }, pathname) !== null);
}
