// A page of the register in any of its indexed orders reads its rows from an index in that order: the database never
// sorts the whole organisation's register to show fifty items (the cost of a page does not grow with the register).
import { describe, expect, it } from "vitest";
import { GearItem } from "~/models/gear-item.server";
import * as register from "~/routes/gear._index";
import { sequelize } from "~/utils/db.server";
import { encodeCursor } from "~/utils/keyset.server";
import { callRoute, getRequest, makeUser } from "../support/factories";
import { makeGearItem } from "../support/gear";
import { statementsWhile, type Statement } from "../support/statements";

/** The register page's own read of its rows (the statement with the page's LIMIT) for `path`. */
async function pageStatement(path: string, user: Awaited<ReturnType<typeof makeUser>>): Promise<Statement> {
  let status = 0;
  const statements = await statementsWhile(async () => {
    status = (await callRoute(register.loader, await getRequest(path, user))).status;
  });
  expect(status).toBe(200);
  const page = statements.filter((s) => /FROM [`"]gear_items[`"]/.test(s.sql) && /LIMIT/.test(s.sql));
  expect(page).toHaveLength(1);
  return page[0]!;
}

/** The plan's lines for a statement: SQLite's EXPLAIN QUERY PLAN, or PostgreSQL's EXPLAIN with sorting made dear. */
async function planOf({ sql, bind }: Statement): Promise<string> {
  if (sequelize.getDialect() === "postgres") {
    return sequelize.transaction(async (transaction) => {
      // On a near-empty table PostgreSQL would rather sort; with sorting and scans made dear it shows what the
      // indexes allow.
      await sequelize.query("SET LOCAL enable_sort = off", { transaction });
      await sequelize.query("SET LOCAL enable_seqscan = off", { transaction });
      const rows = (await sequelize.query(`EXPLAIN ${sql}`, { bind, type: "SELECT", transaction })) as Array<{
        "QUERY PLAN": string;
      }>;
      return rows.map((r) => r["QUERY PLAN"]).join("\n");
    });
  }
  const rows = (await sequelize.query(`EXPLAIN QUERY PLAN ${sql}`, { bind, type: "SELECT" })) as Array<{
    detail: string;
  }>;
  return rows.map((r) => r.detail).join("\n");
}

/**
 * A cursor as a page link carries it: the sort column's value of the middle item (unless it is the code), then its
 * code, so that both the next and the previous page hold an item. The due date's order is read from its own index
 * (migration 0031); the site's is still sorted by the database (migration 0030 says why).
 */
const CURSORS: Record<string, string> = {
  itemCode: encodeCursor(["ORD-1"]),
  kind: encodeCursor(["shackle", "ORD-1"]),
  status: encodeCursor(["in_service", "ORD-1"]),
  wllKg: encodeCursor([2000, "ORD-1"]),
  nextDueOn: encodeCursor(["2027-01-01", "ORD-1"]),
  "nextDueOn, from an item never examined": encodeCursor(["0001-01-01", "ORD-1"]),
};

describe("the register's orders", () => {
  it.each(Object.keys(CURSORS))(
    "sorted by %s, the first page, the next and the previous, either way, are read from an index in their order",
    async (sort) => {
      const admin = await makeUser(["admin"]);
      // One item never examined (no due date) and two that fall due, so each cursor has rows on both sides.
      for (let i = 0; i < 3; i++) await makeGearItem(admin, { itemCode: `ORD-${i}` });
      await GearItem.update({ nextDueOn: "2027-01-01" }, { where: { itemCode: "ORD-1" } });
      await GearItem.update({ nextDueOn: "2027-06-01" }, { where: { itemCode: "ORD-2" } });
      for (const dir of ["asc", "desc"])
        for (const way of ["", `&after=${CURSORS[sort]}`, `&before=${CURSORS[sort]}`]) {
          const plan = await planOf(await pageStatement(`/gear?sort=${sort.split(",")[0]}&dir=${dir}${way}`, admin));
          // A sort of the rows read (SQLite's temporary B-tree, PostgreSQL's Sort node) would grow with the register.
          expect(plan, `${sort} ${dir}${way}`).not.toMatch(
            /TEMP B-TREE FOR (RIGHT PART OF |LAST TERM OF )?ORDER BY|\bSort\b/,
          );
        }
    },
  );
});
