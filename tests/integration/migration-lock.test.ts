// Several app servers starting at once on one PostgreSQL database: each runs `migrate` before serving, and the
// migrations must be applied once, never twice side by side (two CREATE TABLEs of the same table fail half way).
import { randomUUID } from "node:crypto";
import pg from "pg";
import { QueryTypes } from "sequelize";
import { afterAll, describe, expect, inject, it } from "vitest";
import { openDatabase } from "~/utils/db.server";
import { applyMigrations, migrations } from "../../db/umzug";

const serverUrl = inject("postgresServerUrl");
const name = `plumbline_lock_${randomUUID().replaceAll("-", "")}`;

async function admin(sql: string) {
  const client = new pg.Client({ connectionString: `${serverUrl}postgres` });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

describe.skipIf(!serverUrl)("migrations started by two servers at once on PostgreSQL", () => {
  afterAll(async () => {
    if (serverUrl) await admin(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
  });

  it("are applied once: one server migrates, the other waits and finds nothing pending", async () => {
    await admin(`CREATE DATABASE ${name}`);
    const servers = [openDatabase(`${serverUrl}${name}`), openDatabase(`${serverUrl}${name}`)];
    try {
      const applied = await Promise.all(servers.map((db) => applyMigrations(db)));
      expect(applied.map((a) => a.length).sort((x, y) => x - y)).toEqual([0, migrations.length]);
      const [row] = await servers[0]!.query<{ n: number }>("SELECT count(*) AS n FROM sequelize_meta", {
        type: QueryTypes.SELECT,
      });
      expect(row?.n).toBe(migrations.length);
    } finally {
      await Promise.all(servers.map((db) => db.close()));
    }
  });
});
