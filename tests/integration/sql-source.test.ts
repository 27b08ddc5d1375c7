// Queries written in the source carry their values only as bound parameters: no value is ever spliced into SQL
// text, where a NUL would end the statement (a 500) and a quote would change it. Sequelize's own finders write
// their WHERE values inline; text reaches them only after the text rule (tests/integration/text-rule.test.ts).
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { startSignInAttempt } from "~/models/sign-in-attempt.server";
import { findSession } from "~/models/session.server";
import { sessionLifetimes } from "~/utils/session.server";

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

describe("SQL in the source", () => {
  it("splices nothing but fixed fragments (capitalised constants) into statements", () => {
    const offenders: string[] = [];
    for (const { file, text } of FILES) {
      for (const template of templates(text).filter((t) => SQL.test(t))) {
        for (const [, expression] of template.matchAll(/\$\{([^}]*)\}/g)) {
          if (!/^[A-Z][A-Z0-9_]*\b/.test(expression!.trim())) offenders.push(`${file}: \${${expression}}`);
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
});
