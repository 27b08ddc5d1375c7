import type { Sequelize } from "sequelize";
import { SequelizeStorage, Umzug } from "umzug";
import * as demoScenario from "./seeders/0001-demo-scenario";
import * as demoGear from "./seeders/0002-demo-gear";
import * as demoComponents from "./seeders/0003-demo-components";
import * as demoPlans from "./seeders/0004-demo-plans";
import * as demoWorkflow from "./seeders/0005-demo-workflow";

type Seeder = { up: () => Promise<void> };

/** Seeders of the invented demo scenario; never run in production. Each runs once (recorded in SequelizeData). */
export const demoSeeders: Array<[name: string, module: Seeder]> = [
  ["0001-demo-scenario", demoScenario],
  ["0002-demo-gear", demoGear],
  ["0003-demo-components", demoComponents],
  ["0004-demo-plans", demoPlans],
  ["0005-demo-workflow", demoWorkflow],
];

export function createDemoSeeder(sequelize: Sequelize) {
  return new Umzug({
    migrations: demoSeeders.map(([name, module]) => ({ name, up: () => module.up() })),
    storage: new SequelizeStorage({ sequelize, modelName: "SequelizeData" }),
    logger: undefined,
  });
}
