import type { QueryInterface, Sequelize } from "sequelize";
import { SequelizeStorage, Umzug } from "umzug";
import { sqlDialectOf } from "~/utils/sql-dialect.server";
import * as organisationsAndUsers from "./migrations/0001-organisations-and-users";
import * as sitesAndJobs from "./migrations/0002-sites-and-jobs";
import * as components from "./migrations/0003-components";
import * as gearRegister from "./migrations/0004-gear-register";
import * as referenceTables from "./migrations/0005-reference-tables";
import * as plans from "./migrations/0006-plans";
import * as componentFiles from "./migrations/0007-component-files";
import * as planWorkflow from "./migrations/0008-plan-workflow";
import * as signInAttempts from "./migrations/0009-sign-in-attempts";
import * as indexes from "./migrations/0010-indexes";
import * as ruleSets from "./migrations/0011-rule-sets";
import * as gearMass from "./migrations/0012-gear-mass";
import * as sessions from "./migrations/0015-sessions";
import * as signInAttemptsBySource from "./migrations/0016-sign-in-attempts-by-source";
import * as sealedRevisions from "./migrations/0018-sealed-revisions";
import * as revisionAuthors from "./migrations/0019-revision-authors";
import * as liftRecordDocument from "./migrations/0020-lift-record-document";
import * as organisationTimeZone from "./migrations/0021-organisation-time-zone";
import * as examinationRecords from "./migrations/0022-examination-records";
import * as beamGeometry from "./migrations/0023-beam-geometry";
import * as planLoadOverrides from "./migrations/0024-plan-load-overrides";
import * as componentFitTolerance from "./migrations/0025-component-fit-tolerance";
import * as gearSearchIndex from "./migrations/0026-gear-search-index";
import * as offlineSubmissions from "./migrations/0027-offline-submissions";
import * as sealedPrintBodies from "./migrations/0028-sealed-print-bodies";
import * as jobRuns from "./migrations/0029-job-runs";
import * as registerOrderIndexes from "./migrations/0030-register-order-indexes";
import * as registerDueOrderIndex from "./migrations/0031-register-due-order-index";

export type Migration = (params: { context: QueryInterface }) => Promise<void>;
type MigrationModule = { up: Migration; down: Migration };

/**
 * Every migration, in order. Listed by hand (not globbed) so the same list works under tsx,
 * vitest and the production build; db/umzug.test.ts fails when a file in migrations/ is missing here.
 */
export const migrations: Array<[name: string, module: MigrationModule]> = [
  ["0001-organisations-and-users", organisationsAndUsers],
  ["0002-sites-and-jobs", sitesAndJobs],
  ["0003-components", components],
  ["0004-gear-register", gearRegister],
  ["0005-reference-tables", referenceTables],
  ["0006-plans", plans],
  ["0007-component-files", componentFiles],
  ["0008-plan-workflow", planWorkflow],
  ["0009-sign-in-attempts", signInAttempts],
  ["0010-indexes", indexes],
  ["0011-rule-sets", ruleSets],
  ["0012-gear-mass", gearMass],
  ["0015-sessions", sessions],
  ["0016-sign-in-attempts-by-source", signInAttemptsBySource],
  ["0018-sealed-revisions", sealedRevisions],
  ["0019-revision-authors", revisionAuthors],
  ["0020-lift-record-document", liftRecordDocument],
  ["0021-organisation-time-zone", organisationTimeZone],
  ["0022-examination-records", examinationRecords],
  ["0023-beam-geometry", beamGeometry],
  ["0024-plan-load-overrides", planLoadOverrides],
  ["0025-component-fit-tolerance", componentFitTolerance],
  ["0026-gear-search-index", gearSearchIndex],
  ["0027-offline-submissions", offlineSubmissions],
  ["0028-sealed-print-bodies", sealedPrintBodies],
  ["0029-job-runs", jobRuns],
  ["0030-register-order-indexes", registerOrderIndexes],
  ["0031-register-due-order-index", registerDueOrderIndex],
];

/** The umzug runner over `sequelize`, recording applied migrations in SequelizeMeta. */
export function createMigrator(sequelize: Sequelize) {
  return new Umzug({
    migrations: migrations.map(([name, module]) => ({
      name,
      up: ({ context }: { context: QueryInterface }) => module.up({ context }),
      down: ({ context }: { context: QueryInterface }) => module.down({ context }),
    })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, modelName: "SequelizeMeta" }),
    logger: undefined,
  });
}

/** Any fixed number, the same in every release: the PostgreSQL advisory lock the migrations run under. */
const MIGRATION_LOCK = 7_351_640_218;

/**
 * Applies the pending migrations. On PostgreSQL several app servers may start at once: each takes one advisory lock
 * first (held by a transaction that stays open on its own connection while the migrations run on others), so one
 * migrates and the rest wait, then find nothing pending. SQLite takes its own write lock per migration and runs on
 * one machine.
 */
export async function applyMigrations(sequelize: Sequelize) {
  const migrator = createMigrator(sequelize);
  if (sqlDialectOf(sequelize) !== "postgres") return migrator.up();
  return sequelize.transaction(async (transaction) => {
    await sequelize.query("SELECT pg_advisory_xact_lock($key)", { bind: { key: MIGRATION_LOCK }, transaction });
    return migrator.up();
  });
}
