import path from "node:path";
import { pathToFileURL } from "node:url";
import { sendExaminationReminders } from "~/gear/reminders.server";
import { env } from "~/utils/env.server";
import { sequelize } from "~/utils/db.server";
import { applyMigrations, createMigrator } from "./umzug";
import { createDemoSeeder } from "./seeders";
import { backupDatabase, defaultBackupPath, restoreDatabase } from "./backup";
import { copyDatabase, copyReport } from "./copy";

export const DATABASE_COMMANDS =
  "migrate | setup | down | backup [target] | restore <file> | copy <from> <to> | reminders";

/**
 * The database and maintenance commands, built into the production bundle (`node build/server/index.js <command>`,
 * what the npm scripts run) and runnable from source in development (`npx tsx db/cli.ts <command>`):
 * `migrate` applies pending migrations; `setup` also seeds the demo scenario (refused in production); `down` reverts
 * the last migration; `backup [target]` copies the live database; `restore <file>` puts a backup in place (app
 * stopped); `copy <from> <to>` copies a whole database between SQLite files and PostgreSQL URLs (its own two
 * connections, not the app's); `reminders` mails each organisation's admins the gear needing attention (overdue,
 * quarantined, never examined, due soon), once per organisation and day however many servers run it.
 * Throws with a sentence on a bad command or a failure; closes the database when done.
 */
export async function runDatabaseCommand(
  command: string | undefined,
  argument: string | undefined,
  secondArgument?: string,
) {
  try {
    await run(command, argument, secondArgument);
  } finally {
    await sequelize.close();
  }
}

/** The database the commands work on, for messages: the SQLite file, or the PostgreSQL URL without its password. */
function whereTheDataIs() {
  if (!env.databaseUrl) return env.databasePath;
  const url = new URL(env.databaseUrl);
  if (url.password) url.password = "***";
  return url.toString();
}

/** The SQLite file's own backup and restore; a PostgreSQL database is backed up by its server's tools. */
function refuseOnPostgres(command: string) {
  if (env.databaseUrl)
    throw new Error(
      `${command} copies the SQLite file; with DATABASE_URL set, back up with pg_dump and restore with pg_restore (see the README).`,
    );
}

async function run(command: string | undefined, argument: string | undefined, secondArgument: string | undefined) {
  const migrator = createMigrator(sequelize);
  switch (command) {
    case "migrate": {
      const applied = await applyMigrations(sequelize);
      console.log(
        `Migrations applied: ${applied.length ? applied.map((m) => m.name).join(", ") : "none pending"} (${whereTheDataIs()})`,
      );
      return;
    }
    case "setup": {
      if (env.isProduction) throw new Error("db:setup seeds demo users and is refused in production; run db:migrate.");
      const applied = await applyMigrations(sequelize);
      const seeded = await createDemoSeeder(sequelize).up();
      console.log(
        `Database ready at ${whereTheDataIs()}: ${applied.length} migration(s) applied, ${seeded.length} demo seeder(s) run.`,
      );
      return;
    }
    case "down": {
      const reverted = await migrator.down();
      console.log(`Reverted: ${reverted.map((m) => m.name).join(", ") || "nothing"}`);
      return;
    }
    case "backup": {
      refuseOnPostgres("backup");
      const done = await backupDatabase(env.databasePath, argument ?? defaultBackupPath(env.databasePath));
      console.log(
        `Backed up ${env.databasePath} to ${done.file} (${(done.bytes / 1024 / 1024).toFixed(1)} MB, ${done.migrations} migrations, integrity ok)`,
      );
      return;
    }
    case "restore": {
      refuseOnPostgres("restore");
      if (!argument) throw new Error("Usage: npm run db:restore <backup file> (stop the app first)");
      const done = await restoreDatabase(argument, env.databasePath);
      console.log(
        `Restored ${done.databasePath} from ${done.restoredFrom} (${done.migrations} migrations, integrity ok).`,
      );
      console.log(
        done.previousKeptAs
          ? `The database it replaced is kept as ${done.previousKeptAs}.`
          : "There was no database to replace.",
      );
      console.log(
        "Copy the matching uploads back into UPLOAD_DIR, then start the app (npm start applies any newer migrations).",
      );
      return;
    }
    case "copy": {
      if (!argument || !secondArgument)
        throw new Error("Usage: npm run db:copy -- <from> <to> (each an SQLite file path or a postgres:// URL)");
      const result = await copyDatabase(argument, secondArgument, { progress: (line) => console.log(line) });
      for (const line of copyReport(result)) console.log(line);
      if (result.differing.length)
        throw new Error(`The copy differs from the source in ${result.differing.join(", ")}.`);
      return;
    }
    case "reminders": {
      const summaries = await sendExaminationReminders();
      if (!summaries.length) console.log("No gear needs attention: no reminders sent.");
      for (const s of summaries) {
        const to = {
          sent: `sent to ${s.recipients.join(", ")}`,
          "already-sent": "already sent today (another run claimed the day)",
          "no-admin": "NOT sent: the organisation has no active admin",
        }[s.outcome];
        const counts = Object.entries(s.counts)
          .map(([group, n]) => `${n} ${group.replace("_", " ")}`)
          .join(", ");
        console.log(`Organisation ${s.organisationId}: ${counts}; ${to}.`);
      }
      return;
    }
    default:
      throw new Error(`Usage: node build/server/index.js ${DATABASE_COMMANDS} (or serve, the default)`);
  }
}

// Run from source (`npx tsx db/cli.ts migrate`); the production bundle calls runDatabaseCommand itself.
if (process.argv[1] && import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href) {
  runDatabaseCommand(process.argv[2], process.argv[3], process.argv[4]).then(
    // The local mail catcher (outside production) would keep the process alive.
    () => process.exit(0),
    (error: unknown) => {
      console.error(error instanceof Error ? error.message : error);
      process.exit(1);
    },
  );
}
