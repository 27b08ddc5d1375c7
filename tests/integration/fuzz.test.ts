// Generated bodies thrown at every action that takes input, as a signed-in user with the right role:
// random fields, near-valid forms with a field or two broken, malformed bodies, random and mutated
// JSON. Whatever arrives, the answer is never a 500 or a thrown error, a refusal says why, and a
// refusal writes nothing (no commit to any table, no file in storage, no mail).
import fs from "node:fs";
import fc from "fast-check";
import { createSession } from "react-router";
import { QueryTypes } from "sequelize";
import sqlite3 from "sqlite3";
import { beforeAll, describe, expect, it, vi } from "vitest";
import * as adminSettings from "~/routes/admin.settings";
import * as adminUser from "~/routes/admin.users.$userId";
import * as adminUserNew from "~/routes/admin.users.new";
import * as planApi from "~/routes/api.plans.$planId";
import * as solve from "~/routes/api.solve";
import * as componentPage from "~/routes/components.$componentId";
import * as componentEdit from "~/routes/components.$componentId.edit";
import * as componentNew from "~/routes/components.new";
import * as componentList from "~/routes/components._index";
import * as gearItem from "~/routes/gear.$itemId";
import * as gearEdit from "~/routes/gear.$itemId.edit";
import * as gearImport from "~/routes/gear.import";
import * as gearNew from "~/routes/gear.new";
import * as gearRegister from "~/routes/gear._index";
import * as gearPicks from "~/routes/api.gear";
import * as jobEdit from "~/routes/jobs.$jobId.edit";
import * as jobNew from "~/routes/jobs.new";
import * as planPage from "~/routes/plans.$planId";
import * as planDetails from "~/routes/plans.$planId.details";
import * as planLift from "~/routes/plans.$planId.lift";
import * as planReview from "~/routes/plans.$planId.review";
import * as planSubmit from "~/routes/plans.$planId.submit";
import * as planNew from "~/routes/plans.new";
import * as forgotPassword from "~/routes/forgot-password";
import * as login from "~/routes/login";
import * as setPassword from "~/routes/set-password.$token";
import * as settings from "~/routes/settings";
import * as siteEdit from "~/routes/sites.$siteId";
import * as siteNew from "~/routes/sites.new";
import { sequelize } from "~/utils/db.server";
import { env } from "~/utils/env.server";
import { sendMail } from "~/utils/mail.server";
import { settleBackgroundWork } from "~/utils/background.server";
import { stageGearImport } from "~/gear/import.server";
import { addComponentFile } from "~/loads/component-files.server";
import { Component, createComponent } from "~/models/component.server";
import { GearItem } from "~/models/gear-item.server";
import { createJob } from "~/models/job.server";
import { issuePasswordToken } from "~/models/password-token.server";
import { approveRevision, submitRevision } from "~/plans/workflow.server";
import { LiftRecord } from "~/models/lift-record.server";
import { LiftRecordPhoto } from "~/models/lift-record-photo.server";
import { getPlan, PlanRevision } from "~/models/plan.server";
import { PlanRevisionItem } from "~/models/plan-revision-item.server";
import { createSite } from "~/models/site.server";
import type { SessionUser } from "~/models/user.server";
import { PRE_LIFT_CHECKLIST } from "~/plans/workflow";
import { sessionStorage } from "~/utils/session.server";
import { checkUpload } from "~/utils/uploads.server";
import { callRoute, makeUser, sessionCookie, TEST_PASSWORD } from "../support/factories";
import { componentFields } from "../support/component-fields";
import { ELF_BYTES, makeGearItem, MZ_BYTES, PDF_BYTES, PNG_BYTES, SHACKLE_FIELDS } from "../support/gear";
import { twoPointElement } from "../support/plans";
import { readyPlan } from "../support/workflow";

// Mail is counted, not delivered: a refusal must send none, and a success need not pay for SMTP.
vi.mock("~/utils/mail.server", async (importOriginal) => ({
  ...(await importOriginal<typeof import("~/utils/mail.server")>()),
  sendMail: vi.fn(async () => undefined),
}));

// A session is looked up once and kept until a form that changes users succeeds: a refusal writes nothing (the
// property checks it), so the session cannot have changed meanwhile. Saves a query a run. Its last-seen time is
// not written here (tests/integration/sessions.test.ts covers it): the write would land in whichever run came
// five minutes on, refusal or not.
const sessionUsers = vi.hoisted(() => new Map<string, unknown>());
vi.mock("~/models/session.server", async (importOriginal) => {
  const original = await importOriginal<typeof import("~/models/session.server")>();
  return {
    ...original,
    findSession: async (token: string, lifetimes: Parameters<typeof original.findSession>[1]) => {
      if (!sessionUsers.has(token)) sessionUsers.set(token, await original.findSession(token, lifetimes));
      return sessionUsers.get(token) as Awaited<ReturnType<typeof original.findSession>>;
    },
    touchSession: async () => undefined,
  };
});

const RUNS = Number(process.env.FUZZ_RUNS ?? 500);
const BASE = "http://localhost:3000";
/** Statuses any action may answer with; a route may add its own (410 for a spent link). */
const ANSWERS = [400, 404, 409, 422];

// ----- generated values -----

const NASTY = [
  "",
  " ",
  "\t\n",
  "0",
  "-0",
  "-1",
  "1.5",
  "1e309",
  "-1e309",
  "1e-400",
  "NaN",
  "Infinity",
  "-Infinity",
  "0x1F",
  "1,000",
  "1_000",
  "٣",
  "9007199254740993",
  "99999999999999999999999999",
  "2024-02-30",
  "0000-00-00",
  "9999-12-31",
  "2024-01-01T25:61",
  "on",
  "off",
  "true",
  "null",
  "undefined",
  "[]",
  "{}",
  "__proto__",
  "constructor",
  "prototype",
  "\u0000",
  "\u202e",
  "\ufeff",
  "😀👍🏽",
  "Ⅻ",
  "ß",
  "İ",
  "<script>alert(1)</script>",
  "' OR 1=1 --",
  '=HYPERLINK("x")',
  "@SUM(A1)",
  "../../etc/passwd",
  "C:\\con",
  "%00",
  "%",
];
const HUGE = ["x".repeat(70_000), "é".repeat(20_000), "9".repeat(5_000), "😀".repeat(3_000), "1\n2\n".repeat(4_000)];

const textValue = fc.oneof(
  { weight: 4, arbitrary: fc.string({ maxLength: 40 }) },
  { weight: 2, arbitrary: fc.string({ unit: "grapheme", maxLength: 20 }) },
  { weight: 1, arbitrary: fc.string({ unit: "binary", maxLength: 20 }) },
  { weight: 3, arbitrary: fc.oneof(fc.integer(), fc.double(), fc.bigInt()).map(String) },
  { weight: 3, arbitrary: fc.constantFrom(...NASTY) },
  { weight: 1, arbitrary: fc.constantFrom(...HUGE) },
);

/** What a near-valid form's broken field holds: mostly the awkward cases, where a plain string would often still be valid. */
const hostileValue = fc.oneof(
  { weight: 4, arbitrary: fc.constantFrom(...NASTY) },
  { weight: 1, arbitrary: fc.constantFrom(...HUGE) },
  { weight: 2, arbitrary: fc.string({ unit: "binary", maxLength: 20 }) },
  { weight: 2, arbitrary: fc.oneof(fc.integer(), fc.double(), fc.bigInt()).map(String) },
  { weight: 1, arbitrary: fc.string({ maxLength: 40 }) },
);

/** Values drawn from a route's own vocabulary (intents, kinds, ids) as well as anything at all. */
function valueArb(words: readonly string[], values = textValue) {
  return words.length
    ? fc.oneof({ weight: 5, arbitrary: values }, { weight: 2, arbitrary: fc.constantFrom(...words) })
    : values;
}

const FILE_BYTES = [
  PDF_BYTES,
  PNG_BYTES,
  ELF_BYTES,
  MZ_BYTES,
  new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 0, 0x10]),
  new Uint8Array(0),
];
const encode = (s: string) => new TextEncoder().encode(s);
const csvText = (cells: string[]) =>
  `item_code,kind,wll,wll_unit,shackle_type,pin_type,home_site\r\n${cells.map((c) => `"${c.replace(/"/g, '""')}"`).join(",")}\r\n`;
const VALID_CSV = encode(
  "\ufeffitem_code,kind,wll,wll_unit,shackle_type,pin_type\r\nFZ-CSV-1,shackle,2,t,bow,screw\r\n",
);

const fileArb = fc.record({
  field: fc.constantFrom("file", "certificate", "photos", "other"),
  name: fc.oneof(
    fc.constantFrom("drawing.pdf", "photo.png", "register.csv", "", "../../x.pdf", "a\u0000b.png", "😀.jpg"),
    fc.string({ maxLength: 30 }),
  ),
  bytes: fc.oneof(
    { weight: 3, arbitrary: fc.constantFrom(...FILE_BYTES, VALID_CSV) },
    { weight: 2, arbitrary: fc.uint8Array({ maxLength: 64 }) },
    {
      weight: 2,
      arbitrary: fc.array(textValue, { minLength: 7, maxLength: 7 }).map((cells) => encode(csvText(cells))),
    },
    { weight: 1, arbitrary: textValue.map(encode) },
  ),
});
type FileSpec = { field: string; name: string; bytes: Uint8Array };

// ----- form bodies -----

type FormFields = Record<string, string | string[]>;
type Edit = { field: string; op: "replace" | "delete" | "repeat" | "add"; value: string };
type FormRecipe =
  | { type: "random"; entries: Array<[string, string]>; multipart: boolean; files: FileSpec[] }
  | { type: "near"; base: number; edits: Edit[]; multipart: boolean; files: FileSpec[] }
  | { type: "raw"; contentType: string; text: string };

function formRecipe(fields: readonly string[], baseCount: number, words: readonly string[]): fc.Arbitrary<FormRecipe> {
  const value = valueArb(words);
  // Near misses of each name too ("name[]", "NAME"): the route must not read them as the field.
  const nearNames = fields.flatMap((f) => [`${f}[]`, f.toUpperCase()]);
  const key = fc.oneof(
    { weight: 3, arbitrary: fc.constantFrom(...fields) },
    { weight: 2, arbitrary: fc.constantFrom(...nearNames) },
    { weight: 1, arbitrary: fc.string({ maxLength: 12 }) },
    { weight: 1, arbitrary: fc.constantFrom("__proto__", "constructor", "intent", "version", "hasOwnProperty") },
    {
      weight: 1,
      arbitrary: fc
        .tuple(
          fc.constantFrom("lp", "part", "step", "hazard", "person", "ack", "check"),
          fc.integer({ min: -1, max: 1500 }),
          fc.constantFrom("label", "x", "z", "mass", "title", "hold", "name", "role", "gear-matches"),
        )
        .map(([p, i, f]) => `${p}-${i}-${f}`),
    },
  );
  const files = fc.array(fileArb, { maxLength: 2 });
  return fc.oneof(
    {
      weight: 7,
      arbitrary: fc.record({
        type: fc.constant("random" as const),
        entries: fc.array(fc.tuple(key, value), { maxLength: 10 }),
        multipart: fc.boolean(),
        files,
      }),
    },
    {
      weight: 2,
      arbitrary: fc.record({
        type: fc.constant("near" as const),
        base: fc.nat({ max: baseCount - 1 }),
        edits: fc.array(
          fc.record({
            field: key,
            op: fc.constantFrom(
              "replace" as const,
              "replace" as const,
              "delete" as const,
              "repeat" as const,
              "add" as const,
            ),
            value: valueArb(words, hostileValue),
          }),
          { minLength: 1, maxLength: 4 },
        ),
        multipart: fc.boolean(),
        files,
      }),
    },
    // The valid form as it stands, now and then: successes cost more than refusals, so they are fewer.
    {
      weight: 1,
      arbitrary: fc.record({
        type: fc.constant("near" as const),
        base: fc.nat({ max: baseCount - 1 }),
        edits: fc.constant<Edit[]>([]),
        multipart: fc.boolean(),
        files,
      }),
    },
    {
      weight: 1,
      arbitrary: fc.record({
        type: fc.constant("raw" as const),
        contentType: fc.constantFrom(
          "multipart/form-data",
          "multipart/form-data; boundary=zz",
          "application/json",
          "text/plain",
          "application/x-www-form-urlencoded",
          "",
          "image/png",
        ),
        text: fc.oneof(
          fc.string({ maxLength: 60 }),
          fc.constantFrom(
            '--zz\r\nContent-Disposition: form-data; name="a"\r\n\r\nb',
            "--zz--",
            "a=%E0%A4%A&b=%",
            '{"intent":"units"}',
          ),
        ),
      }),
    },
  );
}

function formEntries(
  recipe: Exclude<FormRecipe, { type: "raw" }>,
  bases: ReadonlyArray<() => FormFields>,
): Array<[string, string]> {
  if (recipe.type === "random") return recipe.entries;
  const entries: Array<[string, string]> = Object.entries(bases[recipe.base]!()).flatMap(([k, v]) =>
    (Array.isArray(v) ? v : [v]).map((x): [string, string] => [k, x]),
  );
  for (const edit of recipe.edits) {
    if (edit.op === "add") entries.push([edit.field, edit.value]);
    else if (edit.op === "delete") entries.splice(0, entries.length, ...entries.filter(([k]) => k !== edit.field));
    else if (edit.op === "repeat") entries.push([edit.field, edit.value]);
    else {
      const at = entries.findIndex(([k]) => k === edit.field);
      if (at >= 0) entries[at] = [edit.field, edit.value];
      else entries.push([edit.field, edit.value]);
    }
  }
  return entries;
}

function formRequest(
  url: string,
  recipe: FormRecipe,
  bases: ReadonlyArray<() => FormFields>,
  cookie: string | undefined,
) {
  const headers: Record<string, string> = { Origin: BASE, ...(cookie ? { Cookie: cookie } : {}) };
  if (recipe.type === "raw") {
    if (recipe.contentType) headers["Content-Type"] = recipe.contentType;
    return new Request(url, { method: "POST", body: recipe.text, headers });
  }
  const entries = formEntries(recipe, bases);
  if (!recipe.multipart) {
    headers["Content-Type"] = "application/x-www-form-urlencoded";
    return new Request(url, { method: "POST", body: new URLSearchParams(entries), headers });
  }
  const body = new FormData();
  for (const [k, v] of entries) body.append(k, v);
  for (const f of recipe.files) body.append(f.field, new File([f.bytes as Uint8Array<ArrayBuffer>], f.name));
  return new Request(url, { method: "POST", body, headers });
}

// ----- JSON bodies -----

type JsonEdit = {
  at: number;
  op: "replace" | "delete" | "wrap" | "add-key" | "raw-number";
  value: fc.JsonValue;
  key: string;
  number: string;
};
type JsonRecipe =
  | { type: "random"; value: fc.JsonValue }
  | { type: "near"; base: number; edits: JsonEdit[] }
  | { type: "text"; text: string };

const RAW_NUMBER = "\u0001number\u0001";

const jsonRecipe = (baseCount: number): fc.Arbitrary<JsonRecipe> =>
  fc.oneof(
    { weight: 2, arbitrary: fc.record({ type: fc.constant("random" as const), value: fc.jsonValue({ maxDepth: 4 }) }) },
    {
      weight: 1,
      arbitrary: fc.record({
        type: fc.constant("near" as const),
        base: fc.nat({ max: baseCount - 1 }),
        edits: fc.constant<JsonEdit[]>([]),
      }),
    },
    {
      weight: 6,
      arbitrary: fc.record({
        type: fc.constant("near" as const),
        base: fc.nat({ max: baseCount - 1 }),
        edits: fc.array(
          fc.record({
            at: fc.nat(),
            op: fc.constantFrom(
              "replace" as const,
              "replace" as const,
              "delete" as const,
              "wrap" as const,
              "add-key" as const,
              "raw-number" as const,
            ),
            value: fc.oneof(fc.jsonValue({ maxDepth: 2 }), fc.constantFrom(...NASTY), fc.double()),
            key: fc.oneof(
              fc.constantFrom("__proto__", "constructor", "A", "B", "Z", "", "toString", "results", "id"),
              fc.string({ maxLength: 8 }),
            ),
            number: fc.constantFrom(
              "1e400",
              "-1e400",
              "-0",
              "1e-400",
              "123456789012345678901234567890",
              "0.1e1",
              "5e-324",
            ),
          }),
          { minLength: 1, maxLength: 4 },
        ),
      }),
    },
    {
      weight: 1,
      arbitrary: fc.record({
        type: fc.constant("text" as const),
        text: fc.oneof(
          fc.string({ maxLength: 50 }),
          fc.constantFrom(
            "",
            "{",
            "[1,",
            "null",
            '"x"',
            '{"load":',
            "1e400",
            "{}garbage",
            "\ufeff{}",
            "x".repeat(300_000),
          ),
        ),
      }),
    },
  );

/** Every place in a JSON value (the root too), as a path of keys. */
function jsonPaths(value: unknown, path: Array<string | number> = []): Array<Array<string | number>> {
  const own = [path];
  if (Array.isArray(value)) return own.concat(value.flatMap((v, i) => jsonPaths(v, [...path, i])));
  if (value && typeof value === "object")
    return own.concat(Object.entries(value).flatMap(([k, v]) => jsonPaths(v, [...path, k])));
  return own;
}

function jsonText(recipe: JsonRecipe, bases: ReadonlyArray<() => unknown>): string {
  if (recipe.type === "text") return recipe.text;
  if (recipe.type === "random") return JSON.stringify(recipe.value);
  let doc: unknown = structuredClone(bases[recipe.base]!());
  for (const edit of recipe.edits) {
    const paths = jsonPaths(doc);
    const path = paths[edit.at % paths.length]!;
    const parent = path
      .slice(0, -1)
      .reduce<unknown>((node, k) => (node as Record<string | number, unknown>)[k], doc) as
      Record<string | number, unknown> | unknown[] | undefined;
    const last = path[path.length - 1];
    const current = last === undefined ? doc : (parent as Record<string | number, unknown>)[last];
    const set = (v: unknown) => {
      if (last === undefined) doc = v;
      else Object.defineProperty(parent, last, { value: v, enumerable: true, writable: true, configurable: true });
    };
    if (edit.op === "replace") set(edit.value);
    else if (edit.op === "wrap") set([current]);
    else if (edit.op === "raw-number") set(RAW_NUMBER);
    else if (edit.op === "delete") {
      if (last === undefined) doc = undefined;
      else if (Array.isArray(parent)) parent.splice(Number(last), 1);
      else delete (parent as Record<string | number, unknown>)[last];
    } else if (current && typeof current === "object" && !Array.isArray(current)) {
      Object.defineProperty(current, edit.key, {
        value: edit.value,
        enumerable: true,
        writable: true,
        configurable: true,
      });
    }
  }
  const number = recipe.edits.find((e) => e.op === "raw-number")?.number ?? "1e400";
  return (JSON.stringify(doc) ?? "").split(JSON.stringify(RAW_NUMBER)).join(number);
}

// ----- what is counted -----

/**
 * A connection of the test's own that watches the database file: SQLite bumps its `data_version`
 * whenever any other connection commits a change to any table (insert, update or delete), so a
 * refusal must leave it where it was. Costs the app's own queries nothing.
 * On PostgreSQL, a row trigger on every table counts committed row changes in a table of the test's own (the
 * count rolls back with a write that rolls back, as a refused request's must).
 */
let watcher: sqlite3.Database;
const ON_POSTGRES = sequelize.getDialect() === "postgres";

const POSTGRES_WRITE_COUNTER = [
  "CREATE TABLE test_write_count (n bigint NOT NULL)",
  "INSERT INTO test_write_count VALUES (0)",
  `CREATE FUNCTION test_count_write() RETURNS trigger LANGUAGE plpgsql AS $f$
     BEGIN UPDATE test_write_count SET n = n + 1; RETURN NULL; END $f$`,
  `DO $d$ DECLARE t text; BEGIN
     FOR t IN SELECT tablename FROM pg_tables WHERE schemaname = 'public' AND tablename <> 'test_write_count' LOOP
       EXECUTE format('CREATE TRIGGER test_count_write AFTER INSERT OR UPDATE OR DELETE ON %I
                       FOR EACH ROW EXECUTE FUNCTION test_count_write()', t);
     END LOOP; END $d$`,
];

async function openWatcher() {
  if (ON_POSTGRES) {
    for (const statement of POSTGRES_WRITE_COUNTER) await sequelize.query(statement);
    return;
  }
  watcher = await new Promise<sqlite3.Database>((resolve, reject) => {
    const db: sqlite3.Database = new sqlite3.Database(env.databasePath, sqlite3.OPEN_READONLY, (error) =>
      error ? reject(error) : resolve(db),
    );
  });
}

async function writeCount(): Promise<number> {
  if (ON_POSTGRES) {
    const [row] = await sequelize.query<{ n: number }>("SELECT n FROM test_write_count", { type: QueryTypes.SELECT });
    return Number(row!.n);
  }
  return new Promise((resolve, reject) =>
    watcher.get<{ data_version: number }>("PRAGMA data_version", (error, row) =>
      error ? reject(error) : resolve(row.data_version),
    ),
  );
}

function storedFileCount() {
  try {
    return fs.readdirSync(env.uploadDir).length;
  } catch {
    return 0;
  }
}

function refusalMessage(data: unknown): string | null {
  if (typeof data !== "object" || data === null) return null;
  const { error, message, errors } = data as Record<string, unknown>;
  if (typeof error === "string" && error.trim()) return error;
  if (typeof message === "string" && message.trim()) return message;
  if (typeof errors === "object" && errors !== null) {
    const first = Object.values(errors)
      .flat()
      .find((m) => typeof m === "string" && m.trim());
    if (typeof first === "string") return first;
  }
  return null;
}

// ----- the routes -----

type Action = (args: never) => unknown;
type Result = Awaited<ReturnType<typeof callRoute>>;

type FormTarget = {
  name: string;
  action: Action;
  url: () => string;
  params: () => Record<string, string>;
  user: SessionUser | null;
  bases: Array<() => FormFields>;
  /** Field names beyond the bases' own. */
  extraFields?: string[];
  /** The route's own vocabulary, mixed into the generated values. */
  words?: string[];
  alsoAnswers?: number[];
  /** A success may change a signed-in user or their organisation, so the kept session users are dropped. */
  changesUsers?: boolean;
  afterSuccess?: (result: Result) => Promise<void>;
};

type JsonTarget = {
  name: string;
  action: Action;
  url: () => string;
  params: () => Record<string, string>;
  user: SessionUser;
  method: "POST" | "PUT";
  bases: Array<() => unknown>;
  afterSuccess?: (result: Result) => Promise<void>;
};

const cookies = new Map<number, string>();
async function cookieFor(user: SessionUser | null) {
  if (!user) return undefined;
  if (!cookies.has(user.id)) {
    cookies.set(user.id, await sessionCookie(user));
    // Signing in wrote a session row: the next check counts writes from here.
    knownWrites = null;
  }
  return cookies.get(user.id);
}

/** The write count as of the last refusal; a success sets it aside, to be read again after the success's own resets. */
let knownWrites: number | null = null;

const shown = (data: unknown) => (JSON.stringify(data) ?? String(data)).slice(0, 300);

async function check(
  name: string,
  action: Action,
  request: Request,
  params: Record<string, string>,
  alsoAnswers: number[] = [],
  changesUsers = false,
) {
  // Mail a success sends after its answer is counted before the next run starts.
  await settleBackgroundWork();
  const writesBefore = (knownWrites ??= await writeCount());
  const filesBefore = storedFileCount();
  const mailBefore = vi.mocked(sendMail).mock.calls.length;
  let result: Result;
  try {
    result = await callRoute(action, request, params);
  } catch (error) {
    throw new Error(`${name} threw instead of answering: ${error instanceof Error ? error.stack : String(error)}`, {
      cause: error,
    });
  }
  await settleBackgroundWork();
  const { status, data } = result;
  // Messages are built only on failure: this runs thousands of times.
  if (!((status >= 200 && status < 400) || ANSWERS.includes(status) || alsoAnswers.includes(status)))
    expect.fail(`${name} answered ${status}: ${shown(data)}`);
  if (status < 400) {
    knownWrites = null;
    if (changesUsers) sessionUsers.clear();
    return result;
  }
  const message = refusalMessage(data);
  if (message === null) expect.fail(`${name} refused with ${status} without saying why: ${shown(data)}`);
  if ((await writeCount()) !== writesBefore)
    expect.fail(`${name} refused with ${status} ("${message}") but wrote to the database`);
  if (storedFileCount() !== filesBefore)
    expect.fail(`${name} refused with ${status} ("${message}") but left a file in storage`);
  if (vi.mocked(sendMail).mock.calls.length !== mailBefore)
    expect.fail(`${name} refused with ${status} ("${message}") but sent mail`);
  return result;
}

/** With enough runs to tell, the generated bodies must reach both the route's success and its refusals, or they test little. */
function expectBothOutcomes(name: string, tally: { accepted: number; refused: number }) {
  if (RUNS < 200) return;
  expect(tally.accepted, `no generated body for ${name} was accepted: the valid forms are out of date`).toBeGreaterThan(
    0,
  );
  expect(tally.refused, `no generated body for ${name} was refused`).toBeGreaterThan(0);
}

function fuzzForm(target: FormTarget) {
  it(`${target.name} answers any form cleanly`, { timeout: 120_000 }, async () => {
    const fields = [...new Set([...target.bases.flatMap((b) => Object.keys(b())), ...(target.extraFields ?? [])])];
    const tally = { accepted: 0, refused: 0 };
    await fc.assert(
      fc.asyncProperty(formRecipe(fields, target.bases.length, target.words ?? []), async (recipe) => {
        // Read each run: a success may have given the user a new session (a password change does).
        const cookie = await cookieFor(target.user);
        const request = formRequest(BASE + target.url(), recipe, target.bases, cookie);
        const result = await check(
          target.name,
          target.action,
          request,
          target.params(),
          target.alsoAnswers,
          target.changesUsers,
        );
        if (result.status < 400) await target.afterSuccess?.(result);
        tally[result.status < 400 ? "accepted" : "refused"]++;
      }),
      { numRuns: RUNS },
    );
    expectBothOutcomes(target.name, tally);
  });
}

function fuzzJson(target: JsonTarget) {
  it(`${target.name} answers any JSON cleanly`, { timeout: 120_000 }, async () => {
    const cookie = await cookieFor(target.user);
    const tally = { accepted: 0, refused: 0 };
    await fc.assert(
      fc.asyncProperty(
        jsonRecipe(target.bases.length),
        fc.constantFrom("application/json", "text/plain", ""),
        async (recipe, contentType) => {
          const request = new Request(BASE + target.url(), {
            method: target.method,
            body: jsonText(recipe, target.bases),
            headers: { Origin: BASE, Cookie: cookie!, ...(contentType ? { "Content-Type": contentType } : {}) },
          });
          const result = await check(target.name, target.action, request, target.params());
          if (result.status < 400) await target.afterSuccess?.(result);
          tally[result.status < 400 ? "accepted" : "refused"]++;
        },
      ),
      { numRuns: RUNS },
    );
    expectBothOutcomes(target.name, tally);
  });
}

// ----- fixtures, made once -----

type World = Awaited<ReturnType<typeof makeWorld>>;
let world: World;
const live = { componentVersion: 1, detailsVersion: 1, putVersion: 1, passwordToken: "" };

async function makeWorld() {
  const admin = await makeUser(["admin"], { name: "Ada Admin" });
  const org = admin.organisationId;
  const planner = await makeUser(["planner"], { organisationId: org, name: "Piet Planner" });
  const rigger = await makeUser(["rigger"], { organisationId: org, name: "Rae Rigger" });
  const settingsUser = await makeUser(["rigger"], { organisationId: org, name: "Sol Settings" });
  const target = await makeUser(["rigger"], { organisationId: org, name: "Tam Target" });
  const invitee = await makeUser(["planner"], { organisationId: org, name: "Ivy Invitee", password: null });

  const site = await createSite(
    org,
    { name: "Fuzz works", customer: "Fuzz Water", address: "", siteContact: "", notes: "" },
    admin.id,
  );
  const job = await createJob(
    org,
    { siteId: site.id, workOrder: "WO-FUZZ-1", title: "Fuzz job", description: "", status: "open", startsOn: null },
    admin.id,
  );
  const component = await createComponent(org, twoPointElement(), planner.id);
  // Plans are made from a component of their own: the component page's fuzzing archives the other.
  const planComponent = await createComponent(org, twoPointElement({ name: "Element to plan" }), planner.id);
  const attached = await checkUpload(new File([PNG_BYTES as Uint8Array<ArrayBuffer>], "side.png"), ["png"]);
  if (!attached.ok) throw new Error(attached.message);
  const componentFile = await addComponentFile(
    org,
    component.id,
    attached.upload,
    { kind: "photo", caption: "Side" },
    planner.id,
  );
  const item = await makeGearItem(admin, { itemCode: "FZ-SH-1" });
  const staged = await stageGearImport(org, new File([VALID_CSV as Uint8Array<ArrayBuffer>], "register.csv"), admin.id);
  if (!staged.ok) throw new Error(staged.message);

  // Plans for the workflow steps, each in the state its form acts on.
  const drafting = await readyPlan();
  const editing = await readyPlan();
  const submitting = await readyPlan();
  // An eyebolt due within 30 days warns, so submitting needs an acknowledgement with a reason.
  await GearItem.update(
    { nextDueOn: new Date(Date.now() + 10 * 86_400_000).toISOString().slice(0, 10) },
    { where: { id: submitting.gear.eyeboltA.id } },
  );
  const unacknowledged = await submitRevision(
    submitting.planner.organisationId,
    submitting.plan.id,
    submitting.planner,
    {},
  );
  if (unacknowledged.ok || !unacknowledged.field?.startsWith("ack-"))
    throw new Error(`expected a warning to acknowledge: ${JSON.stringify(unacknowledged)}`);
  const reviewing = await readyPlan();
  expect((await submitRevision(reviewing.planner.organisationId, reviewing.plan.id, reviewing.planner, {})).ok).toBe(
    true,
  );
  const lifting = await readyPlan();
  const approved = await readyPlan();
  for (const p of [lifting, approved]) {
    expect((await submitRevision(p.planner.organisationId, p.plan.id, p.planner, {})).ok).toBe(true);
    expect(
      (
        await approveRevision(p.planner.organisationId, p.plan.id, p.approver, {
          password: TEST_PASSWORD,
          typedName: p.approver.name,
          comment: "",
        })
      ).ok,
    ).toBe(true);
  }
  const editingPlan = (await getPlan(editing.planner.organisationId, editing.plan.id))!;

  await openWatcher();
  return {
    admin,
    planner,
    rigger,
    settingsUser,
    target,
    invitee,
    site,
    job,
    component,
    planComponent,
    componentFile,
    item,
    stagedFileId: staged.preview.fileId,
    drafting,
    editing,
    editingPlan,
    submitting,
    ackField: unacknowledged.field,
    reviewing,
    lifting,
    approved,
  };
}

beforeAll(async () => {
  // The session cookie is the same on every run: its signature is checked once, then its data reused.
  const parsed = new Map<string, Record<string, unknown>>();
  const getSession = sessionStorage.getSession.bind(sessionStorage);
  sessionStorage.getSession = async (cookieHeader, options) => {
    if (!cookieHeader) return getSession(cookieHeader, options);
    if (!parsed.has(cookieHeader)) parsed.set(cookieHeader, { ...(await getSession(cookieHeader, options)).data });
    return createSession({ ...parsed.get(cookieHeader) }) as Awaited<ReturnType<typeof getSession>>;
  };
  world = await makeWorld();
  live.passwordToken = await issuePasswordToken(world.invitee.id, "invite");
  live.componentVersion = world.component.version;
  live.detailsVersion = (await currentRevision(world.drafting.planner, world.drafting.plan.id)).revision.version;
  live.putVersion = world.editingPlan.revision.version;
}, 60_000);

async function currentRevision(planner: SessionUser, planId: number) {
  return (await getPlan(planner.organisationId, planId))!;
}

describe("the fuzzer's own instruments", () => {
  it("notice a committed write from any connection, and no change from a read or a rolled-back transaction", async () => {
    const before = await writeCount();
    await GearItem.count();
    await sequelize
      .transaction(async (transaction) => {
        await GearItem.update({ description: "rolled back" }, { where: { id: world.item.id }, transaction });
        throw new Error("roll back");
      })
      .catch(() => undefined);
    expect(await writeCount()).toBe(before);
    await GearItem.update({ description: "changed" }, { where: { id: world.item.id } });
    const afterPlain = await writeCount();
    expect(afterPlain).not.toBe(before);
    await sequelize.transaction((transaction) =>
      GearItem.update({ description: "" }, { where: { id: world.item.id }, transaction }),
    );
    expect(await writeCount()).not.toBe(afterPlain);
  });
});

describe("fuzzing the forms", () => {
  fuzzForm({
    name: "POST /sites/new",
    action: siteNew.action,
    url: () => "/sites/new",
    params: () => ({}),
    get user() {
      return world.planner;
    },
    bases: [
      () => ({
        name: "Fuzz site",
        customer: "Fuzz customer",
        address: "1 Quay Road",
        siteContact: "Kim, 0100 000",
        notes: "",
      }),
    ],
  });

  fuzzForm({
    name: "POST /sites/:siteId",
    action: siteEdit.action,
    url: () => `/sites/${world.site.id}`,
    params: () => ({ siteId: String(world.site.id) }),
    get user() {
      return world.planner;
    },
    bases: [() => ({ name: "Fuzz works", customer: "Fuzz Water", address: "", siteContact: "", notes: "Gate 3" })],
  });

  fuzzForm({
    name: "POST /jobs/new",
    action: jobNew.action,
    url: () => "/jobs/new",
    params: () => ({}),
    get user() {
      return world.planner;
    },
    bases: [
      () => ({
        siteId: String(world.site.id),
        workOrder: "WO-FUZZ-NEW",
        title: "Lift the cooler",
        description: "",
        status: "open",
        startsOn: "2031-03-04",
      }),
    ],
    words: ["open", "closed", "1", "2"],
  });

  fuzzForm({
    name: "POST /jobs/:jobId/edit",
    action: jobEdit.action,
    url: () => `/jobs/${world.job.id}/edit`,
    params: () => ({ jobId: String(world.job.id) }),
    get user() {
      return world.planner;
    },
    bases: [
      () => ({
        siteId: String(world.site.id),
        workOrder: "WO-FUZZ-1",
        title: "Fuzz job",
        description: "Edited",
        status: "closed",
        startsOn: "",
      }),
    ],
    words: ["open", "closed", "WO-FUZZ-NEW"],
  });

  fuzzForm({
    name: "POST /components/new",
    action: componentNew.action,
    url: () => "/components/new",
    params: () => ({}),
    get user() {
      return world.planner;
    },
    bases: [
      () => componentFields(),
      () =>
        componentFields({
          outlineMode: "custom",
          outlineElevation: "-800, 0\n800, 0\n800, 900\n-800, 900",
          outlinePlan: "-800, -400\n800, -400\n800, 400\n-800, 400",
          "part-0-name": "Motor",
          "part-0-mass": "300",
          "part-0-x": "0",
          "part-0-y": "0",
          "part-0-z": "400",
        }),
    ],
    words: ["certified", "estimated", "weighed", "calculated", "manufacturer", "rectangle", "custom", "M20", "1e3"],
  });

  fuzzForm({
    name: "POST /components/:componentId/edit",
    action: componentEdit.action,
    url: () => `/components/${world.component.id}/edit`,
    params: () => ({ componentId: String(world.component.id) }),
    get user() {
      return world.planner;
    },
    bases: [() => ({ ...componentFields(), version: String(live.componentVersion) })],
    words: ["certified", "estimated", "custom", "1", "2"],
    afterSuccess: async () => {
      live.componentVersion = (await Component.findByPk(world.component.id))!.version;
    },
  });

  fuzzForm({
    name: "POST /components/:componentId",
    action: componentPage.action,
    url: () => `/components/${world.component.id}`,
    params: () => ({ componentId: String(world.component.id) }),
    get user() {
      return world.planner;
    },
    bases: [
      () => ({ intent: "archive" }),
      () => ({ intent: "restore" }),
      () => ({ intent: "upload", kind: "photo", caption: "From the crane side" }),
      () => ({ intent: "remove-file", fileId: String(world.componentFile.id) }),
    ],
    extraFields: ["file"],
    words: ["archive", "restore", "upload", "remove-file", "drawing", "photo"],
  });

  fuzzForm({
    name: "POST /gear/new",
    action: gearNew.action,
    url: () => "/gear/new",
    params: () => ({}),
    get user() {
      return world.admin;
    },
    bases: [
      () => ({ ...SHACKLE_FIELDS, itemCode: "FZ-NEW-1", homeSiteId: String(world.site.id) }),
      () => ({
        itemCode: "FZ-CH-1",
        kind: "chain_sling",
        description: "",
        manufacturer: "",
        serial: "",
        wllValue: "3.15",
        wllUnit: "t",
        chainGrade: "8",
        diameterMm: "10",
        legs: "2",
        lengthM: "2",
      }),
    ],
    words: [
      "shackle",
      "eyebolt",
      "chain_sling",
      "crane",
      "kg",
      "t",
      "lb",
      "shortTon",
      "bow",
      "dee",
      "collar",
      "8",
      "80",
    ],
  });

  fuzzForm({
    name: "POST /gear/:itemId/edit",
    action: gearEdit.action,
    url: () => `/gear/${world.item.id}/edit`,
    params: () => ({ itemId: String(world.item.id) }),
    get user() {
      return world.admin;
    },
    bases: [() => ({ ...SHACKLE_FIELDS, itemCode: "FZ-SH-1", homeSiteId: "" })],
    words: ["shackle", "eyebolt", "kg", "t", "bow", "dee", "screw", "bolt", "FZ-NEW-1"],
  });

  fuzzForm({
    name: "POST /gear/:itemId",
    action: gearItem.action,
    url: () => `/gear/${world.item.id}`,
    params: () => ({ itemId: String(world.item.id) }),
    get user() {
      return world.admin;
    },
    bases: [
      () => ({
        intent: "examination",
        examinedOn: "2024-05-01",
        examiner: "Competent Person Ltd",
        result: "pass",
        defects: "",
        nextDueOn: "",
      }),
      () => ({ intent: "status", status: "quarantined", reason: "Pin thread damaged" }),
      () => ({ intent: "status", status: "in_service", reason: "Pin replaced" }),
      () => ({ intent: "defect", defect: "Bow is bent" }),
    ],
    extraFields: ["certificate"],
    words: ["examination", "status", "defect", "pass", "fail", "in_service", "quarantined", "withdrawn"],
  });

  fuzzForm({
    name: "POST /gear/import",
    action: gearImport.action,
    url: () => "/gear/import",
    params: () => ({}),
    get user() {
      return world.admin;
    },
    bases: [
      () => ({ intent: "confirm", fileId: String(world.stagedFileId), mode: "valid" }),
      () => ({ intent: "preview" }),
    ],
    extraFields: ["file"],
    words: ["confirm", "preview", "all", "valid"],
  });

  fuzzForm({
    name: "POST /admin/users/new",
    action: adminUserNew.action,
    url: () => "/admin/users/new",
    params: () => ({}),
    get user() {
      return world.admin;
    },
    changesUsers: true,
    bases: [() => ({ name: "Fern Fuzz", email: "fern.fuzz@test.invalid", roles: ["planner", "rigger"] })],
    words: ["admin", "planner", "approver", "rigger", "a@b.test"],
  });

  fuzzForm({
    name: "POST /admin/users/:userId",
    action: adminUser.action,
    url: () => `/admin/users/${world.target.id}`,
    params: () => ({ userId: String(world.target.id) }),
    get user() {
      return world.admin;
    },
    changesUsers: true,
    bases: [
      () => ({ intent: "roles", roles: ["rigger", "planner"] }),
      () => ({ intent: "deactivate" }),
      () => ({ intent: "reactivate" }),
      () => ({ intent: "invite" }),
      () => ({ intent: "end-sessions" }),
    ],
    words: ["roles", "deactivate", "reactivate", "invite", "end-sessions", "admin", "planner", "approver", "rigger"],
  });

  fuzzForm({
    name: "POST /admin/settings",
    action: adminSettings.action,
    url: () => "/admin/settings",
    params: () => ({}),
    get user() {
      return world.admin;
    },
    changesUsers: true,
    bases: [() => ({ name: "Fuzz Lifting Ltd", allowSelfApproval: "on", timeZone: "Europe/London" })],
    words: ["on", "off", "America/Chicago", "Mars/Olympus", "Etc/GMT+5"],
  });

  fuzzForm({
    name: "POST /settings",
    action: settings.action,
    url: () => "/settings",
    params: () => ({}),
    get user() {
      return world.settingsUser;
    },
    changesUsers: true,
    bases: [
      () => ({ intent: "units", units: "imperial" }),
      () => ({ intent: "password", current: TEST_PASSWORD, password: "a new password 9", confirm: "a new password 9" }),
      () => ({ intent: "end-other-sessions" }),
      () => ({ intent: "end-session", sessionId: "1" }),
    ],
    words: ["units", "password", "metric", "imperial", "end-session", "end-other-sessions", "1", TEST_PASSWORD],
    afterSuccess: async (result) => {
      // A password change ends every session and starts a new one for this browser.
      const fresh = result.headers.getSetCookie().find((c) => c.startsWith("__plumbline_session="));
      if (fresh) cookies.set(world.settingsUser.id, fresh.split(";")[0]!);
    },
  });

  fuzzForm({
    name: "POST /plans/new",
    action: planNew.action,
    url: () => "/plans/new",
    params: () => ({}),
    get user() {
      return world.planner;
    },
    bases: [
      () => ({
        jobId: String(world.job.id),
        componentId: String(world.planComponent.id),
        title: "Lift the element out",
      }),
    ],
    words: ["1", "2", "0"],
  });

  fuzzForm({
    name: "POST /plans/:planId",
    action: planPage.action,
    url: () => `/plans/${world.approved.plan.id}`,
    params: () => ({ planId: String(world.approved.plan.id) }),
    get user() {
      return world.approved.planner;
    },
    bases: [
      () => ({ intent: "pull-component", version: "1" }),
      () => ({ intent: "new-revision" }),
      () => ({ intent: "assign-rigger", riggerId: String(world.approved.rigger.id) }),
    ],
    extraFields: ["reason"],
    words: ["pull-component", "new-revision", "cancel", "assign-rigger", "1", "2"],
  });

  fuzzForm({
    name: "POST /plans/:planId/details",
    action: planDetails.action,
    url: () => `/plans/${world.drafting.plan.id}/details`,
    params: () => ({ planId: String(world.drafting.plan.id) }),
    get user() {
      return world.drafting.planner;
    },
    bases: [
      () => ({
        version: String(live.detailsVersion),
        floorClearance: "300",
        exclusionZone: "Barriers 3 m round the load path",
        communication: "Radio, channel 2",
        "step-0-title": "Rig",
        "step-0-hold": "on",
        "step-0-notes": "",
        "step-1-title": "Trial lift",
        "hazard-0-hazard": "Pinch points",
        "hazard-0-control": "Hands off the load",
        "person-0-name": "Pat Planner",
        "person-0-role": "lift_supervisor",
      }),
    ],
    words: ["on", "appointed_person", "lift_supervisor", "slinger_signaller", "other"],
    afterSuccess: async () => {
      live.detailsVersion = (await currentRevision(world.drafting.planner, world.drafting.plan.id)).revision.version;
    },
  });

  fuzzForm({
    name: "POST /plans/:planId/submit",
    action: planSubmit.action,
    url: () => `/plans/${world.submitting.plan.id}/submit`,
    params: () => ({ planId: String(world.submitting.plan.id) }),
    get user() {
      return world.submitting.planner;
    },
    bases: [() => ({ [world.ackField]: "Examiner booked for the week after the lift" })],
    // Acknowledgements of checks that do not warn: they must be ignored, not stored.
    extraFields: ["ack-angle-A", "ack-sling-leg-A", "ack-eyebolt-B", "ack-sling-assembly", "ack-", "ack-__proto__"],
    words: ["ok", "Checked with the examiner"],
    afterSuccess: async () => {
      // Back to draft, so the next run has something to submit.
      await PlanRevision.update(
        { status: "draft", submittedBy: null, submittedAt: null },
        { where: { planId: world.submitting.plan.id } },
      );
    },
  });

  fuzzForm({
    name: "POST /plans/:planId/review",
    action: planReview.action,
    url: () => `/plans/${world.reviewing.plan.id}/review`,
    params: () => ({ planId: String(world.reviewing.plan.id) }),
    get user() {
      return world.reviewing.approver;
    },
    bases: [
      () => ({
        intent: "approve",
        password: TEST_PASSWORD,
        typedName: world.reviewing.approver.name,
        comment: "Trial lift first",
      }),
      () => ({ intent: "return", comment: "Add the exclusion zone" }),
    ],
    words: ["approve", "return", TEST_PASSWORD, "Avery Approver"],
    afterSuccess: async () => {
      // Back in review, so the next run has something to approve or return.
      await PlanRevision.update(
        {
          status: "in_review",
          approvedBy: null,
          approvedAt: null,
          approverName: null,
          approvalComment: null,
          fingerprint: null,
          verifyToken: null,
          sealed: null,
        },
        { where: { planId: world.reviewing.plan.id } },
      );
      const revisions = await PlanRevision.findAll({ where: { planId: world.reviewing.plan.id } });
      await PlanRevisionItem.destroy({ where: { revisionId: revisions.map((r) => r.id) } });
    },
  });

  fuzzForm({
    name: "POST /plans/:planId/lift",
    action: planLift.action,
    url: () => `/plans/${world.lifting.plan.id}/lift`,
    params: () => ({ planId: String(world.lifting.plan.id) }),
    get user() {
      return world.lifting.rigger;
    },
    bases: [
      () => ({
        ...Object.fromEntries(PRE_LIFT_CHECKLIST.map((c) => [`check-${c.id}`, "on"])),
        ...Object.fromEntries(Object.values(world.lifting.gear).map((g) => [`gear-${g.id}`, "on"])),
        "hold-2-by": "Dee Marchetti",
        "hold-2-at": "2024-06-01T09:10",
        "hold-3-by": "Dee Marchetti",
        "hold-3-at": "2024-06-01T09:12",
        timeZone: "Europe/London",
        liftedAt: "2024-06-01T09:30",
        notes: "Landed first time",
        nearMiss: "on",
        nearMissDetails: "Tag line snagged the handrail",
      }),
    ],
    extraFields: ["photos"],
    words: ["on", "2024-06-01T09:30", "2999-01-01T00:00", "Europe/London", "Mars/Olympus"],
    afterSuccess: async () => {
      // Back to approved with no record, so the next run has a lift to record.
      const revision = (await PlanRevision.findOne({ where: { planId: world.lifting.plan.id, status: "completed" } }))!;
      const records = await LiftRecord.findAll({ where: { revisionId: revision.id } });
      await LiftRecordPhoto.destroy({ where: { liftRecordId: records.map((r) => r.id) } });
      await LiftRecord.destroy({ where: { revisionId: revision.id } });
      await revision.update({ status: "approved", closedAt: null });
    },
  });

  fuzzForm({
    name: "POST /set-password/:token",
    action: setPassword.action,
    url: () => `/set-password/${live.passwordToken}`,
    params: () => ({ token: live.passwordToken }),
    user: null,
    changesUsers: true,
    bases: [() => ({ password: "a long new password", confirm: "a long new password" })],
    alsoAnswers: [410],
    afterSuccess: async () => {
      live.passwordToken = await issuePasswordToken(world.invitee.id, "invite");
    },
  });
});

describe("search boxes", () => {
  // Search text reaches a LIKE clause, where a NUL would end Sequelize's inline statement early (a 500).
  const QUERIES = ["\u0000", "a\u0000b", "%", "_", "\\", "'", "\u001b[2J", "😀", "x".repeat(5_000), "%00"];

  it.each([
    ["/components", componentList.loader, "q"],
    ["/gear", gearRegister.loader, "q"],
    ["/api/gear", gearPicks.loader, "query"],
  ] as const)("%s takes any search text", async (path, loader, param) => {
    for (const text of QUERIES) {
      const request = new Request(`${BASE}${path}?${new URLSearchParams({ [param]: text })}`, {
        headers: { Cookie: (await cookieFor(world.admin))! },
      });
      const result = await callRoute(loader, request);
      // The picker's API refuses a search over 100 characters; the pages shorten it.
      if (result.status === 400) expect(refusalMessage(result.data)).toBe("The search is at most 100 characters.");
      else expect(result.status, `${path} with ${JSON.stringify(text.slice(0, 20))}`).toBe(200);
    }
  });
});

describe("the sign-in forms, left out of the fuzzing", () => {
  // The sign-in rate limits count refused attempts, so these refusals write by design. A body that
  // is not a form at all is still a clean 400.
  it.each([
    ["/login", login.action],
    ["/forgot-password", forgotPassword.action],
  ] as const)("%s refuses a body that is not a form with 400 and a sentence", async (path, action) => {
    for (const [type, body] of [
      ["multipart/form-data", "x"],
      ["multipart/form-data; boundary=zz", "--zz\r\nbroken"],
      ["application/json", "{}"],
    ]) {
      const result = await callRoute(
        action,
        new Request(BASE + path, { method: "POST", body, headers: { Origin: BASE, "Content-Type": type! } }),
      );
      expect(result).toMatchObject({
        status: 400,
        data: { message: "The form could not be read. Reload the page and send it again." },
      });
    }
  });
});

describe("fuzzing the JSON API", () => {
  const twoLegs = {
    load: { massKg: 2000, cog: { x: 0, y: 0, z: 0 } },
    liftPoints: [
      { id: "A", x: -0.8, y: 0, z: 0, thread: "M20" },
      { id: "B", x: 0.2, y: 0, z: 0, thread: "M20" },
    ],
    hook: { z: 0.8 },
  };

  fuzzJson({
    name: "POST /api/solve",
    action: solve.action,
    url: () => "/api/solve",
    params: () => ({}),
    get user() {
      return world.planner;
    },
    method: "POST",
    bases: [
      () => twoLegs,
      () => ({ ...twoLegs, hook: undefined, legLengths: { A: 1.1314, B: 0.8246 } }),
      () => ({
        ...twoLegs,
        rigging: {
          legs: {
            A: {
              sling: { kind: "chain", wllKg: 3150, hitch: "straight" },
              eyebolt: { family: "collar", thread: "M20" },
              shackle: { type: "bow", pin: "screw", wllKg: 3250 },
            },
            B: {
              sling: {
                kind: "wire",
                wll: { value: 2, unit: "t" },
                inspection: { itemId: "W-1", status: "in_service", examinationDue: "2030-01-01" },
              },
            },
          },
          sharedShackles: [{ legIds: ["A", "B"], wllKg: 4750 }],
          masterLink: { wllKg: 6700 },
          crane: { swlKg: 10000, maxHookHeightM: 6.5 },
          headroom: { clearanceAboveFloorM: 1.8, loadUndersideZM: 0 },
          contingencyPct: 10,
          riggingMassKg: 45,
        },
      }),
    ],
  });

  fuzzJson({
    name: "PUT /api/plans/:planId",
    action: planApi.action,
    url: () => `/api/plans/${world.editing.plan.id}`,
    params: () => ({ planId: String(world.editing.plan.id) }),
    get user() {
      return world.editing.planner;
    },
    method: "PUT",
    bases: [
      () => {
        const r = world.editingPlan.revision;
        return {
          version: live.putVersion,
          title: world.editingPlan.plan.title,
          arrangement: r.arrangement,
          rigging: r.rigging,
          details: r.details,
          load: {
            cog: r.snapshot.cog,
            liftPoints: r.snapshot.liftPoints.map((p) => ({ label: p.label, position: p.position })),
          },
        };
      },
      () => {
        const r = world.editingPlan.revision;
        return {
          version: live.putVersion,
          title: "Given lengths",
          arrangement: { ...r.arrangement, mode: "lengths", legLengthsM: { A: 1.2, B: 1.2 } },
          rigging: r.rigging,
          details: r.details,
        };
      },
      () => {
        const r = world.editingPlan.revision;
        return {
          version: live.putVersion,
          title: "On a beam",
          arrangement: {
            ...r.arrangement,
            kind: "beam",
            beam: { massKg: 120, wllKg: 5000, lengthM: 2, dropLengthM: 1 },
          },
          rigging: { legs: {} },
          details: r.details,
        };
      },
    ],
    afterSuccess: async (result) => {
      live.putVersion = (result.data as { version: number }).version;
    },
  });
});
