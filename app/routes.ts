import { index, prefix, route, type RouteConfig } from "@react-router/dev/routes";

export default [
  index("routes/_index.tsx"),
  route("login", "routes/login.tsx"),
  route("logout", "routes/logout.tsx"),
  route("forgot-password", "routes/forgot-password.tsx"),
  route("set-password/:token", "routes/set-password.$token.tsx"),
  route("settings", "routes/settings.tsx"),
  route("reference", "routes/reference.tsx"),
  route("verify/:token", "routes/verify.$token.tsx"),

  ...prefix("sites", [
    index("routes/sites._index.tsx"),
    route("new", "routes/sites.new.tsx"),
    route(":siteId", "routes/sites.$siteId.tsx"),
  ]),
  ...prefix("jobs", [
    index("routes/jobs._index.tsx"),
    route("new", "routes/jobs.new.tsx"),
    route(":jobId", "routes/jobs.$jobId.tsx"),
    route(":jobId/edit", "routes/jobs.$jobId.edit.tsx"),
  ]),

  ...prefix("components", [
    index("routes/components._index.tsx"),
    route("new", "routes/components.new.tsx"),
    route(":componentId", "routes/components.$componentId.tsx"),
    route(":componentId/edit", "routes/components.$componentId.edit.tsx"),
  ]),

  ...prefix("gear", [
    index("routes/gear._index.tsx"),
    route("new", "routes/gear.new.tsx"),
    route("import", "routes/gear.import.tsx"),
    route("export.csv", "routes/gear.export.csv.ts"),
    route(":itemId", "routes/gear.$itemId.tsx"),
    route(":itemId/edit", "routes/gear.$itemId.edit.tsx"),
  ]),
  route("files/:fileId", "routes/files.$fileId.ts"),

  ...prefix("admin", [
    index("routes/admin._index.tsx"),
    route("users/new", "routes/admin.users.new.tsx"),
    route("users/:userId", "routes/admin.users.$userId.tsx"),
    route("settings", "routes/admin.settings.tsx"),
    route("outbox", "routes/admin.outbox.tsx"),
    route("outbox/:mailId", "routes/admin.outbox.$mailId.tsx"),
  ]),

  ...prefix("plans", [
    route("new", "routes/plans.new.tsx"),
    route(":planId", "routes/plans.$planId.tsx"),
    route(":planId/edit", "routes/plans.$planId.edit.tsx"),
    route(":planId/details", "routes/plans.$planId.details.tsx"),
    route(":planId/submit", "routes/plans.$planId.submit.tsx"),
    route(":planId/review", "routes/plans.$planId.review.tsx"),
    route(":planId/history", "routes/plans.$planId.history.tsx"),
    route(":planId/lift", "routes/plans.$planId.lift.tsx"),
    route(":planId/print", "routes/plans.$planId.print.tsx"),
    route(":planId/print.pdf", "routes/plans.$planId.print.pdf.ts"),
    route(":planId/lift-record.pdf", "routes/plans.$planId.lift-record.pdf.ts"),
  ]),

  ...prefix("api", [
    route("ping", "routes/api.ping.ts"),
    route("sync", "routes/api.sync.ts"),
    route("solve", "routes/api.solve.ts"),
    route("gear", "routes/api.gear.ts"),
    route("plans", "routes/api.plans.ts"),
    route("plans/:planId", "routes/api.plans.$planId.ts"),
  ]),
] satisfies RouteConfig;
