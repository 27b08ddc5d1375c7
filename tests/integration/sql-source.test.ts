// Queries written in the source carry their values only as bound parameters: no value is ever spliced into SQL
// text, where a NUL would end the statement (a 500) and a quote would change it. Sequelize's own finders write
// their WHERE values inline; text reaches them only after the text rule (tests/integration/text-rule.test.ts).
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { startSignInAttempt } from "~/models/sign-in-attempt.server";
import { findSession } from "~/models/session.server";
import { sessionLifetimes } from "~/utils/session.server";
import { listComponentsPage } from "~/models/component.server";
import { searchGearItems } from "~/models/gear-item-reads.server";
import { listUsersPage } from "~/models/user.server";
import { adminWithSite, makeGearItem } from "../support/gear";

function sourceFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return sourceFiles(full);
    return /\.tsx?$/.test(entry.name) && !/\.test\.tsx?$/.test(entry.name) ? [full] : [];
  });
}

const FILES = [...sourceFiles("app"), ...sourceFiles("db")].map((file) => ({
  file,
  text: fs.readFileSync(file, "utf8"),
}));

const SQL = /\b(SELECT\s[\s\S]*\sFROM|INSERT\s+INTO|UPDATE\s+\S+\s+SET|DELETE\s+FROM)\b/;

/** A quoted piece of SQL followed by `+`, in each kind of quotes. */
const SQL_WORDS = String.raw`\b(?:SELECT|INSERT INTO|DELETE FROM|UPDATE \w+ SET|WHERE)\b`;
const CONCATENATED_SQL = new RegExp(
  [`"[^"\\n]*${SQL_WORDS}[^"\\n]*"`, `'[^'\\n]*${SQL_WORDS}[^'\\n]*'`, `\`[^\`]*${SQL_WORDS}[^\`]*\``]
    .map((quoted) => `${quoted}\\s*\\+`)
    .join("|"),
  "g",
);

/** Every template literal in `text` (good enough for this source: no nested templates inside SQL). */
function templates(text: string): string[] {
  return [...text.matchAll(/`((?:[^`\\]|\\.)*)`/g)].map((m) => m[1]!);
}

/**
 * `db:copy` (db/copy.ts) copies whatever tables the database has, so it must splice names: each read from the
 * database's own schema and written through its `quote()`, the `$n` placeholders of bound values, and its batch size.
 * Nothing else may be spliced there either.
 */
const COPY_SPLICES = new Set(["columns", "after", "order", "limit", 'tuples.join(", ")']);
function copySplice(file: string, expression: string) {
  return (
    file === path.join("db", "copy.ts") && (/^quote\(\w+(\.\w+)?\)$/.test(expression) || COPY_SPLICES.has(expression))
  );
}

describe("SQL in the source", () => {
  it("splices nothing but fixed fragments (capitalised constants) into statements", () => {
    const offenders: string[] = [];
    for (const { file, text } of FILES) {
      for (const template of templates(text).filter((t) => SQL.test(t))) {
        for (const [, expression] of template.matchAll(/\$\{([^}]*)\}/g)) {
          if (!/^[A-Z][A-Z0-9_]*\b/.test(expression!.trim()) && !copySplice(file, expression!.trim()))
            offenders.push(`${file}: \${${expression}}`);
        }
      }
    }
    expect(offenders, "bind values with `bind: { name }` and $name in the SQL").toEqual([]);
  });

  it("never builds statements by concatenation or Sequelize replacements (which are inlined, not bound)", () => {
    const offenders = FILES.flatMap(({ file, text }) => [
      ...(/\breplacements\s*:/.test(text) ? [`${file}: replacements`] : []),
      ...[...text.matchAll(CONCATENATED_SQL)].map((m) => `${file}: ${m[0]}`),
      ...[...text.matchAll(/\bliteral\(\s*`[^`]*\$\{/g)].map((m) => `${file}: ${m[0]}`),
    ]);
    expect(offenders).toEqual([]);
  });

  it("a NUL, a quote or a statement in a value reaching the hand-written queries is only a value", async () => {
    for (const email of ["a\u0000b@test.invalid", "x'; DROP TABLE users; --@test.invalid", "\u0000"]) {
      const attempt = await startSignInAttempt({ email, addressKey: "direct" });
      expect(attempt.ok, JSON.stringify(email)).toBe(true);
    }
    expect(await findSession("\u0000' OR '1'='1", sessionLifetimes())).toBeNull();
  });

  it("a search text or a cursor value reaching the list queries is only a value, never SQL or a bound name", async () => {
    const { admin } = await adminWithSite();
    const item = await makeGearItem(admin, { description: "Bow shackle for the pump lift" });
    const search = async (q: string) =>
      (
        await searchGearItems(admin.organisationId, { q, sort: "itemCode", dir: "asc" }, "2026-01-01", {
          cursor: null,
          towards: "next",
          limit: 5,
        })
      ).rows;
    expect((await search(item.itemCode)).length).toBe(1);
    const users = (await listUsersPage(admin.organisationId, { cursor: null, towards: "next", limit: 5 })).rows;
    expect(users.length).toBe(2);
    for (const text of ["x'\u0000", "') OR 1=1 --", "$limit", '"$phrase" OR 1', "pump' OR '1'='1"]) {
      // The register's search text passes the text rule first (no NUL reaches the full-text phrase parser).
      if (!text.includes("\u0000")) expect((await search(text)).length, JSON.stringify(text)).toBe(0);
      // A register cursor holding the text: the items after it by item id, nothing else.
      const afterText = await searchGearItems(admin.organisationId, { sort: "itemCode", dir: "asc" }, "2026-01-01", {
        cursor: [text],
        towards: "next",
        limit: 5,
      });
      expect(
        afterText.rows.map((r) => r.itemCode),
        JSON.stringify(text),
      ).toEqual(item.itemCode > text ? [item.itemCode] : []);
      const components = await listComponentsPage(
        admin.organisationId,
        { cursor: null, towards: "next", limit: 5 },
        {
          query: text,
        },
      );
      expect(components.rows, JSON.stringify(text)).toEqual([]);
      // Active first, then by name and id: the users after (active, `text`, 0) are those named after `text`.
      const after = await listUsersPage(admin.organisationId, { cursor: [1, text, 0], towards: "next", limit: 5 });
      const expected = users.filter((u) => u.name > text).map((u) => u.id);
      expect(
        after.rows.map((u) => u.id),
        JSON.stringify(text),
      ).toEqual(expected);
    }
  });
});
