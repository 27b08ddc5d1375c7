import { env } from "~/utils/env.server";
import { sequelize } from "~/utils/db.server";
import { createMigrator } from "./umzug";
import { createDemoSeeder } from "./seeders";
import { backupDatabase, defaultBackupPath, restoreDatabase } from "./backup";

/**
 * `tsx db/cli.ts migrate` applies pending migrations; `setup` also seeds the demo scenario; `down` reverts the last
 * migration; `backup [target]` copies the live database; `restore <file>` puts a backup in place (app stopped).
 */
async function main(command: string | undefined, argument: string | undefined) {
  const migrator = createMigrator(sequelize);
  switch (command) {
    case "migrate": {
      const applied = await migrator.up();
      console.log(
        `Migrations applied: ${applied.length ? applied.map((m) => m.name).join(", ") : "none pending"} (${env.databasePath})`,
      );
      break;
    }
    case "setup": {
      if (env.isProduction) throw new Error("db:setup seeds demo users and is refused in production; run db:migrate.");
      const applied = await migrator.up();
      const seeded = await createDemoSeeder(sequelize).up();
      console.log(
        `Database ready at ${env.databasePath}: ${applied.length} migration(s) applied, ${seeded.length} demo seeder(s) run.`,
      );
      break;
    }
    case "down": {
      const reverted = await migrator.down();
      console.log(`Reverted: ${reverted.map((m) => m.name).join(", ") || "nothing"}`);
      break;
    }
    case "backup": {
      const done = await backupDatabase(env.databasePath, argument ?? defaultBackupPath(env.databasePath));
      console.log(
        `Backed up ${env.databasePath} to ${done.file} (${(done.bytes / 1024 / 1024).toFixed(1)} MB, ${done.migrations} migrations, integrity ok)`,
      );
      break;
    }
    case "restore": {
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
      break;
    }
    default:
      throw new Error("Usage: tsx db/cli.ts migrate | setup | down | backup [target] | restore <file>");
  }
  await sequelize.close();
}

main(process.argv[2], process.argv[3]).catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
