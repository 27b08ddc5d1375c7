// One rule for the text of every field: no control characters (newline and tab only in multi-line fields) and no
// bidirectional overrides, refused with a sentence and nothing written; and no schema that forgets it.
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import * as gearNew from "~/routes/gear.new";
import * as siteNew from "~/routes/sites.new";
import { GearItem } from "~/models/gear-item.server";
import { Site } from "~/models/site.server";
import { CONTROL_CHARACTER_MESSAGE, hasControlCharacters, safeText, withoutControlCharacters } from "~/utils/forms";
import { callRoute, makeUser, postForm } from "../support/factories";
import { SHACKLE_FIELDS } from "../support/gear";

const NUL = "\u0000";
const BEL = "\u0007";
const RLO = "\u202e";

describe("the text rule", () => {
  it("refuses C0 and C1 controls, DEL and every bidirectional embedding, override and isolate mark", () => {
    const line = safeText();
    const block = safeText({ multiline: true });
    for (const bad of [NUL, BEL, "\u001b", "\u007f", "\u0085", "\u009f", "\u202a", "\u202b", "\u202c", "\u202d", RLO])
      expect(line.safeParse(`a${bad}b`).success, JSON.stringify(bad)).toBe(false);
    for (const bad of ["\u2066", "\u2067", "\u2068", "\u2069", NUL]) {
      const result = block.safeParse(`a${bad}b`);
      expect(result.error?.issues[0]?.message).toBe(CONTROL_CHARACTER_MESSAGE);
    }
    expect(line.safeParse("Pump house\tB").success).toBe(false);
    expect(line.safeParse("Pump house\nB").success).toBe(false);
    expect(block.safeParse("Gate 3\r\nThen left\tby the tank").success).toBe(true);
    // Letters of right-to-left scripts and the plain direction marks are text, not overrides.
    expect(line.safeParse("مضخة \u200f Ölkühler ß 😀").success).toBe(true);
    expect(hasControlCharacters("a\tb", false)).toBe(true);
    expect(withoutControlCharacters(`a${NUL}b${RLO}c\td`)).toBe("abc\td");
  });

  it("a gear item's description, manufacturer or serial holding NUL, BEL or a right-to-left override is refused, and nothing is stored", async () => {
    const admin = await makeUser(["admin"]);
    const before = await GearItem.count();
    const cases = [
      ["description", `Bow shackle${NUL}`],
      ["manufacturer", `Acme${BEL}`],
      ["serial", `${RLO}1234-gpj.exe`],
    ] as const;
    for (const [field, value] of cases) {
      const res = await callRoute(
        gearNew.action,
        await postForm("/gear/new", { ...SHACKLE_FIELDS, itemCode: `TR-${field}`, [field]: value }, admin),
      );
      expect(res.status, field).toBe(400);
      expect(res.data, field).toMatchObject({ errors: { [field]: [CONTROL_CHARACTER_MESSAGE] } });
    }
    expect(await GearItem.count()).toBe(before);
    const plain = await callRoute(
      gearNew.action,
      await postForm("/gear/new", { ...SHACKLE_FIELDS, itemCode: "TR-OK", manufacturer: "Acmé Lifting" }, admin),
    );
    expect(plain.status).toBe(302);
  });

  it("a multi-line field keeps its line breaks and a one-line field refuses them", async () => {
    const planner = await makeUser(["planner"]);
    const ok = await callRoute(
      siteNew.action,
      await postForm(
        "/sites/new",
        {
          name: "Weir works",
          customer: "Test Water",
          address: "1 Quay\r\nHull",
          siteContact: "",
          notes: "Gate 3\tnorth",
        },
        planner,
      ),
    );
    expect(ok.status).toBe(302);
    expect((await Site.findOne({ where: { name: "Weir works" } }))?.address).toBe("1 Quay\r\nHull");
    const refused = await callRoute(
      siteNew.action,
      await postForm("/sites/new", { name: "Weir\tworks", customer: "Test Water", notes: "" }, planner),
    );
    expect(refused.status).toBe(400);
    expect(refused.data).toMatchObject({ errors: { name: [CONTROL_CHARACTER_MESSAGE] } });
  });
});

/** Source files under `dir` (recursively), tests left out. */
function sourceFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return sourceFiles(full);
    return /\.tsx?$/.test(entry.name) && !/\.test\.tsx?$/.test(entry.name) ? [full] : [];
  });
}

// Schemas that read no one's input: the environment, the stored copy of a component, and the stateless solve API
// (pure core, nothing stored; its ids only come back to the caller). `forms.ts` holds the rule itself.
const PLAIN_STRING_ALLOWED = [
  "app/utils/env.server.ts",
  "app/utils/forms.ts",
  "app/loads/component-definition.ts",
  "app/statics/api.ts",
];

describe("schemas in the source", () => {
  it("take text through safeText (or optionalText, requiredText, searchText), never a bare z.string()", () => {
    const offenders = sourceFiles("app")
      .filter((file) => !PLAIN_STRING_ALLOWED.includes(file))
      .flatMap((file) =>
        fs
          .readFileSync(file, "utf8")
          .split("\n")
          .map((line, i) => ({ line, at: `${file}:${i + 1}` }))
          .filter(({ line }) => /\bz\s*\.\s*string\s*\(|^\s*\.string\s*\(/.test(line) && !line.trim().startsWith("*"))
          .map(({ at, line }) => `${at}: ${line.trim()}`),
      );
    expect(offenders, "use safeText() from ~/utils/forms").toEqual([]);
  });
});
