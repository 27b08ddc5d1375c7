// Every route module's loader and action, called as each kind of visitor, against one table of
// what each of them should get. A route added to app/routes.ts without a row here fails the test.
import type { RouteConfigEntry } from "@react-router/dev/routes";
import { beforeAll, describe, expect, it } from "vitest";
import routes from "~/routes";
import { storeCaughtMail } from "~/models/caught-mail.server";
import { createComponent } from "~/models/component.server";
import { createJob } from "~/models/job.server";
import { updateOrganisationSettings } from "~/models/organisation.server";
import { issuePasswordToken } from "~/models/password-token.server";
import { approveRevision, submitRevision } from "~/plans/workflow.server";
import { PlanRevision } from "~/models/plan.server";
import { createPlanFromComponent } from "~/plans/revisions.server";
import { createSite } from "~/models/site.server";
import type { SessionUser } from "~/models/user.server";
import { ROLES } from "~/utils/roles";
import { checkUpload, transactionWithFiles } from "~/utils/uploads.server";
import { callRoute, makeUser, sessionCookie, TEST_PASSWORD } from "../support/factories";
import { makeGear, twoPointElement } from "../support/plans";
import { readyPlan } from "../support/workflow";
import { PDF_BYTES } from "../support/gear";

/**
 * What each visitor gets. "login": sent to sign in (/login?redirectTo=...); "redirect": redirected
 * anywhere else (a success, signing out, or a page that sends signed-in users on); a number: that status; "n/a": the module has no
 * loader (or no action). Actions are sent an empty form (JSON `{}` for /api routes), so a route
 * that takes input refuses it (400/409) or a role check answers first (403).
 * Columns: anonymous, admin, planner, appointed person, rigger, and a user of another organisation
 * holding every role. Another organisation's rows are 404, as if they did not exist.
 */
// prettier-ignore
const MATRIX: Record<string, { loader: string; action: string }> = {
  //                                        anon    admin   planner approver rigger  other
  "/":                            { loader: "login  200     200     200      200     200",      action: "n/a" },
  "/login":                       { loader: "200    redirect redirect redirect redirect redirect", action: "401 401 401 401 401 401" },
  "/logout":                      { loader: "redirect redirect redirect redirect redirect redirect", action: "redirect redirect redirect redirect redirect redirect" },
  "/forgot-password":             { loader: "n/a",                                           action: "400    400     400     400      400     400" },
  "/set-password/:token":         { loader: "200    200     200     200      200     200",      action: "400    400     400     400      400     400" },
  "/settings":                    { loader: "login  200     200     200      200     200",      action: "login  400     400     400      400     400" },
  "/reference":                   { loader: "login  200     200     200      200     200",      action: "n/a" },
  "/verify/:token":               { loader: "200    200     200     200      200     200",      action: "n/a" },

  "/sites":                       { loader: "login  200     200     403      403     200",      action: "n/a" },
  "/sites/new":                   { loader: "login  200     200     403      403     200",      action: "login  400     400     403      403     400" },
  "/sites/:siteId":               { loader: "login  200     200     403      403     404",      action: "login  400     400     403      403     404" },
  "/jobs":                        { loader: "login  200     200     200      200     200",      action: "n/a" },
  "/jobs/new":                    { loader: "login  200     200     403      403     200",      action: "login  400     400     403      403     400" },
  "/jobs/:jobId":                 { loader: "login  200     200     200      200     404",      action: "n/a" },
  "/jobs/:jobId/edit":            { loader: "login  200     200     403      403     404",      action: "login  400     400     403      403     404" },

  "/components":                  { loader: "login  200     200     200      200     200",      action: "n/a" },
  "/components/new":              { loader: "login  200     200     403      403     200",      action: "login  400     400     403      403     400" },
  "/components/:componentId":     { loader: "login  200     200     200      200     404",      action: "login  400     400     403      403     404" },
  "/components/:componentId/edit":{ loader: "login  200     200     403      403     404",      action: "login  400     400     403      403     404" },

  "/gear":                        { loader: "login  200     200     200      200     200",      action: "n/a" },
  "/gear/new":                    { loader: "login  200     403     403      403     200",      action: "login  400     403     403      403     400" },
  "/gear/import":                 { loader: "login  200     403     403      403     200",      action: "login  400     403     403      403     400" },
  "/gear/export.csv":             { loader: "login  200     200     200      200     200",      action: "n/a" },
  "/gear/:itemId":                { loader: "login  200     200     200      200     404",      action: "login  400     400     400      400     404" },
  "/gear/:itemId/edit":           { loader: "login  200     403     403      403     404",      action: "login  400     403     403      403     404" },
  "/files/:fileId":               { loader: "login  200     200     200      200     404",      action: "n/a" },

  "/admin":                       { loader: "login  200     403     403      403     200",      action: "n/a" },
  "/admin/users/new":             { loader: "login  200     403     403      403     200",      action: "login  400     403     403      403     400" },
  "/admin/users/:userId":         { loader: "login  200     403     403      403     404",      action: "login  400     403     403      403     404" },
  "/admin/settings":              { loader: "login  200     403     403      403     200",      action: "login  400     403     403      403     400" },
  "/admin/outbox":                { loader: "login  200     403     403      403     200",      action: "n/a" },
  "/admin/outbox/:mailId":        { loader: "login  200     403     403      403     404",      action: "n/a" },

  "/plans/new":                   { loader: "login  200     200     403      403     200",      action: "login  400     400     403      403     400" },
  "/plans/:planId":               { loader: "login  200     200     200      200     404",      action: "login  400     400     400      403     404" },
  "/plans/:planId/edit":          { loader: "login  200     200     403      403     404",      action: "n/a" },
  "/plans/:planId/details":       { loader: "login  200     200     403      403     404",      action: "login  400     400     403      403     404" },
  "/plans/:planId/submit":        { loader: "login  200     200     403      403     404",      action: "login  409     409     403      403     404" },
  "/plans/:planId/review":        { loader: "login  403     403     200      403     404",      action: "login  403     403     400      403     404" },
  "/plans/:planId/history":       { loader: "login  200     200     200      200     404",      action: "n/a" },
  "/plans/:planId/lift":          { loader: "login  403     403     403      409     404",      action: "login  403     403     403      400     404" },
  "/plans/:planId/print":         { loader: "login  409     409     409      409     404",      action: "n/a" },
  "/plans/:planId/print.pdf":     { loader: "login  redirect redirect redirect redirect 404",  action: "n/a" },
  "/plans/:planId/lift-record.pdf": { loader: "login  redirect redirect redirect redirect 404", action: "n/a" },

  "/api/ping":                    { loader: "401    200     200     200      200     200",      action: "n/a" },
  "/api/sync":                    { loader: "n/a",                                        action: "401    400     400     400      400     400" },
  "/api/solve":                   { loader: "401    405     405     405      405     405",      action: "401    400     400     400      400     400" },
  "/api/gear":                    { loader: "401    200     200     200      200     200",      action: "n/a" },
  "/api/plans":                   { loader: "401    200     200     200      200     200",      action: "401    405     405     405      405     405" },
  "/api/plans/:planId":           { loader: "401    200     200     200      200     404",      action: "401    400     400     403      403     404" },
};

const ACTORS = ["anonymous", "admin", "planner", "approver", "rigger", "other"] as const;
type Actor = (typeof ACTORS)[number];
type Outcome = "n/a" | "login" | "redirect" | number;

/** Routes anyone may open: they must never send an anonymous visitor to sign in. */
const PUBLIC_ROUTES = ["/login", "/logout", "/forgot-password", "/set-password/:token", "/verify/:token"];
/** Show their row to whoever holds the token, by design: a printed plan's title and site, an invitee's name. */
const TOKEN_ROUTES = ["/verify/:token", "/set-password/:token"];

function parseCells(cells: string): Record<Actor, Outcome> | "n/a" {
  if (cells.trim() === "n/a") return "n/a";
  const tokens = cells.trim().split(/\s+/);
  if (tokens.length !== ACTORS.length) throw new Error(`"${cells}" needs ${ACTORS.length} cells, one per visitor`);
  return Object.fromEntries(
    ACTORS.map((actor, i) => [actor, /^\d+$/.test(tokens[i]!) ? Number(tokens[i]) : (tokens[i] as Outcome)]),
  ) as Record<Actor, Outcome>;
}

/** Every URL pattern in the route config with the module that serves it. */
function flattenRoutes(entries: readonly RouteConfigEntry[], parent = ""): Array<{ path: string; file: string }> {
  return entries.flatMap((entry) => {
    const joined = [parent, entry.path ?? ""].filter(Boolean).join("/");
    const own =
      entry.path !== undefined || entry.index
        ? [{ path: `/${joined}`.replace(/\/+$/, "") || "/", file: entry.file }]
        : [];
    return [...own, ...flattenRoutes(entry.children ?? [], joined)];
  });
}

const ROUTES = flattenRoutes(routes);
const MODULES = import.meta.glob<Record<string, unknown>>("../../app/routes/*.{ts,tsx}");

async function routeModule(file: string) {
  const load = MODULES[`../../app/${file}`];
  if (!load) throw new Error(`No module at app/${file}`);
  return load() as Promise<{ loader?: (args: never) => unknown; action?: (args: never) => unknown }>;
}

const MARKER = "Qx7mark";
const BASE = "http://localhost:3000";

type Fixtures = {
  actors: Record<Exclude<Actor, "anonymous">, SessionUser>;
  params: Record<string, string>;
  passwordToken: string;
  verifyToken: string;
};

let fixtures: Fixtures;

beforeAll(async () => {
  const { planner, approver, rigger, plan: approvedPlan } = await readyPlan();
  const org = planner.organisationId;
  await updateOrganisationSettings(org, { name: `${MARKER} Lifting`, allowSelfApproval: false });
  const admin = await makeUser(["admin"], { organisationId: org, name: `${MARKER} Admin` });
  const other = await makeUser([...ROLES], { name: "Olive Other" });
  const target = await makeUser(["rigger"], { organisationId: org, name: `${MARKER} Target` });

  expect((await submitRevision(org, approvedPlan.id, planner, {})).ok).toBe(true);
  expect(
    (
      await approveRevision(org, approvedPlan.id, approver, {
        password: TEST_PASSWORD,
        typedName: approver.name,
        comment: "",
      })
    ).ok,
  ).toBe(true);
  const verifyToken = (await PlanRevision.findOne({ where: { planId: approvedPlan.id, status: "approved" } }))
    ?.verifyToken;
  if (!verifyToken) throw new Error("the approved revision has no verify token");

  const site = await createSite(
    org,
    { name: `${MARKER} works`, customer: `${MARKER} Water`, address: "", siteContact: "", notes: "" },
    admin.id,
  );
  const job = await createJob(
    org,
    {
      siteId: site.id,
      workOrder: `WO-${MARKER}`,
      title: `${MARKER} job`,
      description: "",
      status: "open",
      startsOn: null,
    },
    admin.id,
  );
  const component = await createComponent(org, twoPointElement({ name: `${MARKER} element` }), planner.id);
  const created = await createPlanFromComponent(org, job.id, component.id, `${MARKER} lift`, planner.id);
  if (!created.ok) throw new Error(created.message);
  const gear = await makeGear(org, "shackle", {
    wllKg: 2000,
    description: `${MARKER} shackle`,
    shackleType: "bow",
    pinType: "screw",
  });
  const mail = await storeCaughtMail({
    organisationId: org,
    fromAddress: "no-reply@plumbline.invalid",
    toAddress: admin.email,
    subject: `${MARKER} message`,
    textBody: "",
    htmlBody: null,
    receivedAt: new Date(),
  });
  const checked = await checkUpload(new File([PDF_BYTES as Uint8Array<ArrayBuffer>], `${MARKER}.pdf`), ["pdf"]);
  if (!checked.ok) throw new Error(checked.message);
  const file = await transactionWithFiles((_t, store) =>
    store(checked.upload, { organisationId: org, purpose: "drawing", uploadedBy: admin.id }),
  );

  fixtures = {
    actors: { admin, planner, approver, rigger, other },
    params: {
      siteId: String(site.id),
      jobId: String(job.id),
      componentId: String(component.id),
      itemId: String(gear.id),
      fileId: String(file.id),
      userId: String(target.id),
      mailId: String(mail.id),
      planId: String(created.plan.id),
    },
    passwordToken: await issuePasswordToken(target.id, "invite"),
    verifyToken,
  };
});

/** The route's params filled from the rows made above; a param with no row here fails loudly. */
function paramsFor(path: string): Record<string, string> {
  const params: Record<string, string> = {};
  for (const [, name] of path.matchAll(/:(\w+)/g)) {
    const value =
      name === "token"
        ? path.startsWith("/verify/")
          ? fixtures.verifyToken
          : path.startsWith("/set-password/")
            ? fixtures.passwordToken
            : undefined
        : fixtures.params[name!];
    if (value === undefined)
      throw new Error(`${path}: no test row for :${name}; create one in beforeAll and map it in paramsFor`);
    params[name!] = value;
  }
  return params;
}

async function requestFor(kind: "loader" | "action", path: string, params: Record<string, string>, actor: Actor) {
  const url = BASE + path.replace(/:(\w+)/g, (_, name: string) => encodeURIComponent(params[name]!));
  const user = actor === "anonymous" ? undefined : fixtures.actors[actor];
  const headers: Record<string, string> = user ? { Cookie: await sessionCookie(user) } : {};
  if (kind === "loader") return new Request(url, { headers });
  headers.Origin = BASE;
  if (path.startsWith("/api/")) {
    headers["Content-Type"] = "application/json";
    return new Request(url, { method: path === "/api/plans/:planId" ? "PUT" : "POST", body: "{}", headers });
  }
  headers["Content-Type"] = "application/x-www-form-urlencoded";
  return new Request(url, { method: "POST", body: "", headers });
}

function outcomeOf(status: number, headers: Headers): Outcome {
  if (status >= 300 && status < 400)
    return (headers.get("Location") ?? "").startsWith("/login?redirectTo=") ? "login" : "redirect";
  return status;
}

/** A refusal says why: an `error` or `message` sentence, field `errors`, or a plain-text body. */
function hasMessage(data: unknown): boolean {
  if (typeof data === "string") return data.trim().length > 0;
  if (typeof data !== "object" || data === null) return false;
  const { error, message, errors } = data as Record<string, unknown>;
  if (typeof error === "string" && error.length > 0) return true;
  if (typeof message === "string" && message.length > 0) return true;
  return (
    typeof errors === "object" &&
    errors !== null &&
    Object.values(errors).some((v) => Array.isArray(v) && v.some((m) => typeof m === "string" && m.length > 0))
  );
}

function bodyText(data: unknown) {
  return typeof data === "string" ? data : JSON.stringify(data ?? null);
}

describe("the role x route matrix", () => {
  it("has one row for every route in app/routes.ts and none for a route that is gone", () => {
    const configured = ROUTES.map((r) => r.path).sort();
    expect(new Set(configured).size, "a URL pattern appears twice in app/routes.ts").toBe(configured.length);
    expect(Object.keys(MATRIX).sort()).toEqual(configured);
  });

  it("sends nobody anonymous to sign in on a public route, and answers another organisation's rows with 404", () => {
    for (const path of PUBLIC_ROUTES) {
      for (const kind of ["loader", "action"] as const) {
        const cells = parseCells(MATRIX[path]![kind]);
        if (cells !== "n/a") expect(cells.anonymous, `${kind} of ${path}`).not.toBe("login");
      }
    }
    for (const path of Object.keys(MATRIX).filter((p) => /:(?!token\b)\w+/.test(p))) {
      for (const kind of ["loader", "action"] as const) {
        const cells = parseCells(MATRIX[path]![kind]);
        if (cells !== "n/a") expect(cells.other, `${kind} of ${path} for another organisation`).toBe(404);
      }
    }
  });

  describe.each(ROUTES)("$path", ({ path, file }) => {
    it.each(["loader", "action"] as const)("%s answers each visitor as the table says", async (kind) => {
      const row = MATRIX[path];
      if (!row) throw new Error(`${path} is not in the matrix: add a row for it`);
      const expected = parseCells(row[kind]);
      const fn = (await routeModule(file))[kind];
      if (expected === "n/a") {
        expect(fn, `${file} has a ${kind} but the matrix says n/a`).toBeUndefined();
        return;
      }
      expect(fn, `${file} has no ${kind} but the matrix expects one`).toBeTypeOf("function");
      const params = paramsFor(path);
      const got: Partial<Record<Actor, Outcome>> = {};
      for (const actor of ACTORS) {
        const res = await callRoute(fn!, await requestFor(kind, path, params, actor), params);
        got[actor] = outcomeOf(res.status, res.headers);
        expect(res.status, `${kind} of ${path} as ${actor}`).toBeLessThan(500);
        if (res.status >= 400)
          expect(
            hasMessage(res.data),
            `${kind} of ${path} as ${actor} refused without saying why: ${bodyText(res.data).slice(0, 200)}`,
          ).toBe(true);
        if ((actor === "other" || actor === "anonymous") && !TOKEN_ROUTES.includes(path)) {
          expect(bodyText(res.data), `${kind} of ${path} shows ${actor} the organisation's data`).not.toContain(MARKER);
        }
      }
      expect(got).toEqual(expected);
    });
  });
});
