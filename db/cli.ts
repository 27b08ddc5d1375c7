import { env } from "~/env.server";
import { sequelize } from "~/db.server";
import { createMigrator } from "./umzug";
import { createDemoSeeder } from "./seeders";

/** `tsx db/cli.ts migrate` applies pending migrations; `setup` also seeds the demo scenario; `down` reverts the last migration. */
async function main(command: string | undefined) {
  const migrator = createMigrator(sequelize);
  switch (command) {
    case "migrate": {
      const applied = await migrator.up();
      console.log(`Migrations applied: ${applied.length ? applied.map((m) => m.name).join(", ") : "none pending"} (${env.databasePath})`);
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
    default:
      throw new Error("Usage: tsx db/cli.ts migrate | setup | down");
  }
  await sequelize.close();
}

main(process.argv[2]).catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
