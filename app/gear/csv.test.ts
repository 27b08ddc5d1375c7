import { describe, expect, it } from "vitest";
import { CSV_HEADERS } from "~/gear/csv-columns";
import { exportRow, neutraliseCell, parseCsv, restoreCell, toCsv, validateGearRows } from "~/gear/csv";

const HEAD = "item_code,kind,wll,wll_unit,thread,eyebolt_family,shackle_type,pin_type,home_site";
const sites = new Map([["fernbrook", 7]]);

function rowsOf(text: string) {
  const parsed = parseCsv(text);
  if (!parsed.ok) throw new Error(parsed.message);
  return parsed.rows;
}

describe("formula cells", () => {
  it("neutralises cells a spreadsheet would run (OWASP CSV injection: = + - @ tab CR) and restores them", () => {
    for (const cell of ["=cmd|' /C calc'!A0", "+1+1", "-2+3", "@SUM(A1)", "\tx", "\rx"]) {
      expect(neutraliseCell(cell)).toBe(`'${cell}`);
      expect(restoreCell(neutraliseCell(cell))).toBe(cell);
    }
    expect(neutraliseCell("KR-1")).toBe("KR-1");
    expect(restoreCell("'quoted on purpose")).toBe("'quoted on purpose");
  });

  it("writes neutralised, quoted CSV that reads back to the same cells", () => {
    const cells = [
      ["item_code", "kind", "wll", "wll_unit", "description"],
      ["KR-1", "shackle", "1", "t", '=HYPERLINK("http://x.invalid")'],
      ["KR-2", "shackle", "2", "t", "two\nlines, with a comma"],
    ];
    const csv = toCsv(cells);
    expect(csv.startsWith("\uFEFF")).toBe(true);
    expect(csv).toContain(`"'=HYPERLINK(""http://x.invalid"")"`);
    expect(rowsOf(csv).map((r) => r.values.description)).toEqual([cells[1]![4], cells[2]![4]]);
  });
});

describe("reading CSV", () => {
  it("numbers rows by the line they start on, across quoted line breaks and blank lines", () => {
    const rows = rowsOf(
      `\uFEFF${HEAD}\r\nA,shackle,1,t,,,bow,screw,\r\n\r\n"B",shackle,2,t,,,bow,screw,"multi\nline"\r\nC,shackle,3,t,,,bow,screw,\r\n`,
    );
    expect(rows.map((r) => [r.line, r.values.item_code])).toEqual([
      [2, "A"],
      [4, "B"],
      [6, "C"],
    ]);
  });

  it("reads semicolon-separated files too", () => {
    expect(rowsOf("item_code;kind;wll;wll_unit\nA;shackle;1;t\n")[0]?.values.kind).toBe("shackle");
  });

  it("refuses a file without the needed columns, with repeated columns, or without rows", () => {
    expect(parseCsv("code,kind\nA,shackle\n")).toMatchObject({
      ok: false,
      message: expect.stringContaining("lacks item_code, wll, wll_unit"),
    });
    expect(parseCsv("item_code,kind,wll,wll_unit,wll\nA,shackle,1,t,2\n")).toMatchObject({
      ok: false,
      message: expect.stringContaining("wll more than once"),
    });
    expect(parseCsv(`${HEAD}\n`)).toMatchObject({ ok: false, message: expect.stringContaining("no items") });
    expect(parseCsv("")).toMatchObject({ ok: false, message: expect.stringContaining("empty") });
  });

  it("lists columns it does not read", () => {
    const parsed = parseCsv("item_code,kind,wll,wll_unit,colour\nA,shackle,1,t,red\n");
    expect(parsed).toMatchObject({ ok: true, ignoredColumns: ["colour"] });
  });

  it("exports every column the import knows", () => {
    expect(CSV_HEADERS).toEqual(
      expect.arrayContaining(["item_code", "kind", "wll", "wll_unit", "home_site", "status", "next_due_on"]),
    );
  });
});

describe("validating rows", () => {
  it("accepts good rows and matches home sites by name regardless of case", () => {
    const { valid, errors } = validateGearRows(
      rowsOf(`${HEAD}\nKR-EB-1,eyebolt,700,kg,M16,collar,,,Fernbrook\nKR-SH-1,Shackle,3.25,t,,,bow,bolt,\n`),
      sites,
    );
    expect(errors).toEqual([]);
    expect(valid.map((v) => [v.input.itemCode, v.input.kind, v.input.wllValue, v.input.homeSiteId])).toEqual([
      ["KR-EB-1", "eyebolt", 700, 7],
      ["KR-SH-1", "shackle", 3.25, null],
    ]);
  });

  it("names the line and the reason of each bad row", () => {
    const text = [
      HEAD,
      "KR-1,shackle,lots,t,,,bow,screw,", // wrong type
      "KR-2,shackle,-2,t,,,bow,screw,", // negative WLL
      "KR-3,hook,1,t,,,,,", // unknown kind
      "KR-4,shackle,1,t,,,bow,screw,",
      "KR-4,shackle,1,t,,,bow,screw,", // duplicate id
      "KR-5,shackle,1,t,,,bow,screw,Nowhere", // unknown site
      "KR-6,shackle,1,t,M16,,bow,screw,", // thread on a shackle
      "KR-7,eyebolt,1,stone,M16,collar,,,", // unknown unit
    ].join("\n");
    const { valid, errors } = validateGearRows(rowsOf(text), sites);
    expect(valid.map((v) => v.input.itemCode)).toEqual(["KR-4"]);
    const byLine = Object.fromEntries(errors.map((e) => [e.line, e.messages.join(" ")]));
    expect(byLine[2]).toContain("wll: Enter the WLL marked on the item, as a number.");
    expect(byLine[3]).toContain("wll: The WLL must be more than zero.");
    expect(byLine[4]).toContain("kind: Choose the kind of item");
    expect(byLine[6]).toContain("item_code: KR-4 is already on line 5 of this file.");
    expect(byLine[7]).toContain('no site named "Nowhere"');
    expect(byLine[8]).toContain("thread: Thread does not apply to a shackle");
    expect(byLine[9]).toContain("wll_unit:");
    expect(Object.keys(byLine).map(Number)).toEqual([2, 3, 4, 6, 7, 8, 9]);
  });

  it("asks for the size fields a kind needs", () => {
    const { errors } = validateGearRows(rowsOf(`${HEAD}\nKR-EB-9,eyebolt,700,kg,,,,,\n`), sites);
    expect(errors[0]?.messages).toEqual([
      "thread: Enter the thread for an eyebolt.",
      "eyebolt_family: Enter the eyebolt type for an eyebolt.",
    ]);
  });
});

describe("the item's own mass (mass_kg)", () => {
  it("is read on import, checked like the form, and written back on export", () => {
    const head = "item_code,kind,wll,wll_unit,shackle_type,pin_type,mass_kg";
    const { valid, errors } = validateGearRows(
      rowsOf(
        `${head}\r\nSH-1,shackle,2,t,bow,screw,0.36\r\nSH-2,shackle,2,t,bow,screw,\r\nSH-3,shackle,2,t,bow,screw,-1\r\n`,
      ),
      sites,
    );
    expect(valid.map((v) => v.input.massKg)).toEqual([0.36, null]);
    expect(errors).toHaveLength(1);
    expect(errors[0]!.messages.join(" ")).toMatch(/^mass_kg: /);
    const exported = exportRow({
      ...valid[0]!.input,
      homeSiteName: null,
      wllKg: 2000,
      status: "in_service",
      lastExaminedOn: null,
      nextDueOn: null,
      dueState: "never_examined",
    });
    expect(exported[CSV_HEADERS.indexOf("mass_kg")]).toBe(0.36);
  });
});
