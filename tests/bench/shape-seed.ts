// Shapes the grown benchmark database (after load-seed.ts) like an organisation that has worked for years: the seeded
// plans spread over many jobs, every third one with two superseded revisions before its current one, comments,
// acknowledgements and a trail of audit rows on each; and a second, small organisation (its admin
// small-admin@example.com, the demo password) with `smallItems` register items, to compare a small register with
// the big one on the same server. Written with INSERT ... SELECT, so the triggers keep the search index in step.
// Run: DATABASE_PATH=... PLUMBLINE_ENV=demo tsx tests/bench/shape-seed.ts <firstPlanId> <lastPlanId> <smallItems>
import { QueryTypes } from "sequelize";
import { sequelize } from "~/utils/db.server";

const [firstArg, lastArg, smallArg] = process.argv.slice(2);
const firstPlanId = Number(firstArg);
const lastPlanId = Number(lastArg);
const smallItems = Number(smallArg ?? 1000);
const seeded = `BETWEEN ${firstPlanId} AND ${lastPlanId}`;
const started = performance.now();

async function run(sql: string, replacements: unknown[] = []) {
  await sequelize.query(sql, { replacements });
}

const [org] = await sequelize.query<{ organisationId: number; adminId: number; passwordHash: string }>(
  "SELECT organisation_id AS organisationId, id AS adminId, password_hash AS passwordHash FROM users WHERE email = 'admin@example.com'",
  { type: QueryTypes.SELECT },
);
if (!org) throw new Error("Seed the demo scenario first (db/cli.ts setup).");
const [site] = await sequelize.query<{ id: number }>("SELECT id FROM sites WHERE organisation_id = ? LIMIT 1", {
  replacements: [org.organisationId],
  type: QueryTypes.SELECT,
});
const now = new Date().toISOString().replace("T", " ").replace("Z", " +00:00");
const planCount = lastPlanId - firstPlanId + 1;
const jobCount = Math.max(20, Math.floor(planCount / 40));

{
  // Many jobs, a quarter of them closed, the plans spread over them.
  await run(
    `WITH RECURSIVE n(i) AS (SELECT 1 UNION ALL SELECT i + 1 FROM n WHERE i < ?)
     INSERT INTO jobs (organisation_id, site_id, work_order, title, description, status, starts_on, created_at, updated_at)
     SELECT ?, ?, 'BW-' || printf('%05d', i), 'Bench job ' || i, '', CASE WHEN i % 4 = 0 THEN 'closed' ELSE 'open' END,
            date('2026-01-01', '+' || (i % 365) || ' days'), ?, ? FROM n`,
    [jobCount, org.organisationId, site!.id, now, now],
  );
  const [firstJob] = await sequelize.query<{ id: number }>(
    "SELECT MIN(id) AS id FROM jobs WHERE work_order LIKE 'BW-%' AND organisation_id = ?",
    { replacements: [org.organisationId], type: QueryTypes.SELECT },
  );
  await run(`UPDATE plans SET job_id = ? + (id % ?) WHERE id ${seeded}`, [firstJob!.id, jobCount]);

  // Every third plan: its current revision becomes revision 3, after two superseded ones.
  const columns = (
    await sequelize.query<{ name: string }>("PRAGMA table_info(plan_revisions)", { type: QueryTypes.SELECT })
  )
    .map((c) => c.name)
    .filter((c) => !["id", "revision", "status", "superseded_by_revision", "verify_token"].includes(c));
  await run(`UPDATE plan_revisions SET revision = 3 WHERE plan_id ${seeded} AND plan_id % 3 = 0 AND revision = 1`);
  for (const n of [1, 2])
    await run(
      `INSERT INTO plan_revisions (${columns.join(", ")}, revision, status, superseded_by_revision, verify_token)
       SELECT ${columns.join(", ")}, ${n}, 'superseded', ${n + 1}, NULL FROM plan_revisions
        WHERE plan_id ${seeded} AND plan_id % 3 = 0 AND revision = 3`,
    );

  // Two comments on each current revision, an acknowledgement on every fourth, and an audit trail on every plan.
  await run(
    `INSERT INTO plan_comments (revision_id, user_id, kind, body, created_at)
     SELECT p.current_revision_id, u.id, 'return', 'Check the sling angles against the new hook height.', ?
       FROM plans p JOIN users u ON u.email IN ('approver@example.com', 'admin@example.com') WHERE p.id ${seeded}`,
    [now],
  );
  await run(
    `INSERT INTO plan_acknowledgements (revision_id, check_id, check_item, check_message, reason, user_id, created_at)
     SELECT p.current_revision_id, 'angle-A', 'Sling leg A angle', 'Leg A is 52 deg from vertical.',
            'The appointed person accepted the angle for this lift.', ?, ?
       FROM plans p WHERE p.id ${seeded} AND p.id % 4 = 0`,
    [org.adminId, now],
  );
  for (const [action, details] of [
    ["created", null],
    ["saved", '{"revision":1,"changed":["rigging"],"resultStatus":200}'],
    ["saved", '{"revision":1,"changed":["arrangement"],"resultStatus":200}'],
    ["submitted for review", '{"revision":1}'],
    ["warning acknowledged", '{"revision":1,"check":"angle-A"}'],
    ["approved", '{"revision":1}'],
    ["printed", '{"revision":1}'],
    ["printed", '{"revision":1}'],
  ] as const)
    await run(
      `INSERT INTO audit_events (organisation_id, user_id, entity, entity_id, action, details, created_at)
       SELECT ?, ?, 'plan', id, ?, ?, ? FROM plans WHERE id ${seeded}`,
      [org.organisationId, org.adminId, action, details, now],
    );

  // The small organisation: its admin, and the first `smallItems` items of the big register copied to it.
  await run("INSERT INTO organisations (name, allow_self_approval, created_at, updated_at) VALUES (?, 0, ?, ?)", [
    "Brindle Fabrication",
    now,
    now,
  ]);
  const [small] = await sequelize.query<{ id: number }>("SELECT MAX(id) AS id FROM organisations", {
    type: QueryTypes.SELECT,
  });
  await run(
    `INSERT INTO users (organisation_id, email, name, password_hash, units, active, created_at, updated_at)
     VALUES (?, 'small-admin@example.com', 'Tamsin Brindle', ?, 'metric', 1, ?, ?)`,
    [small!.id, org.passwordHash, now, now],
  );
  await run(
    "INSERT INTO user_roles (user_id, role) SELECT id, 'admin' FROM users WHERE email = 'small-admin@example.com'",
  );
  const gearColumns = (
    await sequelize.query<{ name: string }>("PRAGMA table_info(gear_items)", { type: QueryTypes.SELECT })
  )
    .map((c) => c.name)
    .filter((c) => !["id", "organisation_id", "home_site_id", "status_changed_by"].includes(c));
  await run(
    `INSERT INTO gear_items (organisation_id, ${gearColumns.join(", ")})
     SELECT ?, ${gearColumns.join(", ")} FROM gear_items WHERE organisation_id = ? ORDER BY item_code LIMIT ?`,
    [small!.id, org.organisationId, smallItems],
  );
}
await sequelize.query("ANALYZE");
const count = async (sql: string) => (await sequelize.query<{ n: number }>(sql, { type: QueryTypes.SELECT }))[0]!.n;
const totals = {
  jobs: await count("SELECT COUNT(*) AS n FROM jobs"),
  revisions: await count("SELECT COUNT(*) AS n FROM plan_revisions"),
  comments: await count("SELECT COUNT(*) AS n FROM plan_comments"),
  auditRows: await count("SELECT COUNT(*) AS n FROM audit_events"),
  smallItems: await count(
    "SELECT COUNT(*) AS n FROM gear_items g JOIN users u ON u.organisation_id = g.organisation_id WHERE u.email = 'small-admin@example.com'",
  ),
};
await sequelize.close();
console.log(JSON.stringify({ ...totals, seconds: (performance.now() - started) / 1000 }));
