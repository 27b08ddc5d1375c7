import { Organisation } from "~/models/organisation.server";
import { createUser, findUserByEmail } from "~/models/user.server";
import { createJob } from "~/models/job.server";
import { createSite } from "~/models/site.server";
import { DEFAULT_TIME_ZONE, addDays, todayIn } from "~/utils/dates";
import type { Role } from "~/utils/roles";

/** The password of every demo account. */
export const DEMO_PASSWORD = "plumbline-demo";

/** The demo accounts, one per role (an invented company; any likeness to a real firm is chance). */
export const DEMO_USERS: Array<{ email: string; name: string; roles: Role[] }> = [
  { email: "admin@example.com", name: "Morag Ellison", roles: ["admin"] },
  { email: "planner@example.com", name: "Tomasz Wren", roles: ["planner"] },
  { email: "approver@example.com", name: "Priya Okonedo", roles: ["approver"] },
  { email: "rigger@example.com", name: "Dale Hutton", roles: ["rigger"] },
];

export async function up() {
  if (await findUserByEmail(DEMO_USERS[0]!.email)) return;
  const organisation = await Organisation.create({ name: "Kestrel Rotating Plant Services" });
  const orgId = organisation.id;
  const users = [];
  for (const u of DEMO_USERS)
    users.push(await createUser({ organisationId: orgId, ...u, password: DEMO_PASSWORD }, null));
  const planner = users[1]!;

  const brewery = await createSite(
    orgId,
    {
      name: "Fernbrook Brewery, compressor house",
      customer: "Fernbrook Brewing Co.",
      address: "Unit 4, Millrace Lane\nFernbrook FB3 2QT",
      siteContact: "Gareth Pryce, engineering manager, 01632 960 418",
      notes:
        "5 t overhead crane in the compressor house (hook 5.2 m above floor). Permit to work from the site engineer; hot works banned.",
    },
    planner.id,
  );
  const water = await createSite(
    orgId,
    {
      name: "Castlemere Treatment Works, blower hall",
      customer: "Castlemere Water",
      address: "Reservoir Road\nCastlemere CM7 9LD",
      siteContact: "Anita Bose, site supervisor, 01632 960 772",
      notes: "2 t gantry with a chain block over blower B1; the floor hatch must stay barriered during lifts.",
    },
    planner.id,
  );

  await createJob(
    orgId,
    {
      siteId: brewery.id,
      workOrder: "KR-24117",
      title: "Overhaul of air compressor C2: lift out and refit the compression element",
      description: "Take the element out of the housing for workshop overhaul; refit and align on the dowels after.",
      status: "open",
      startsOn: addDays(todayIn(DEFAULT_TIME_ZONE), 38),
    },
    planner.id,
  );
  await createJob(
    orgId,
    {
      siteId: water.id,
      workOrder: "KR-24121",
      title: "Blower B1: replace the gearbox and its top cover",
      description: "Remove the gearbox top cover, lift the gearbox off its base and set the exchange unit.",
      status: "open",
      startsOn: addDays(todayIn(DEFAULT_TIME_ZONE), 52),
    },
    planner.id,
  );
  await createJob(
    orgId,
    {
      siteId: water.id,
      workOrder: "KR-24130",
      title: "Pump P4: drive motor exchange",
      description: "Swap the 75 kW drive motor for the rewound spare.",
      status: "open",
      startsOn: null,
    },
    planner.id,
  );
}
