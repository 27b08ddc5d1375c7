// Register items as the plan editor's picker offers them (GearPick), with the spec the checks need.
import { Op } from "sequelize";
import { isBeamKind, parseLugPositions, type GearKind } from "~/gear/kinds";
import { GearItem } from "~/models/gear-item.server";
import { sequelize } from "~/utils/db.server";
import { caseInsensitiveLike } from "~/utils/sql-dialect.server";
import type { GearPick, GearRole } from "~/plans/rigging";
import type { EyeboltFamily, SlingSpec, Wll } from "~/statics/checks";
import { DEFAULT_RULE_SET, findModeFactor, type ReferenceTables, type RuleSetId } from "~/statics/reference";

const SLING_KINDS: Partial<Record<GearKind, SlingSpec["kind"]>> = {
  chain_sling: "chain",
  wire_rope_sling: "wire",
  web_sling: "web",
  round_sling: "round",
};

export const ROLE_KINDS: Record<GearRole, readonly GearKind[]> = {
  eyebolt: ["eyebolt"],
  shackle: ["shackle"],
  sling: ["chain_sling", "wire_rope_sling", "web_sling", "round_sling"],
  masterLink: ["master_link"],
  crane: ["crane", "hoist", "chain_block", "lever_hoist"],
  beam: ["beam", "spreader"],
};

export function roleOfKind(kind: GearKind): GearRole | null {
  for (const [role, kinds] of Object.entries(ROLE_KINDS) as Array<[GearRole, readonly GearKind[]]>)
    if (kinds.includes(kind)) return role;
  return null;
}

function describe(item: GearItem) {
  const parts = [item.description || item.kind.replace(/_/g, " ")];
  if (item.thread) parts.push(item.thread);
  if (item.diameterMm) parts.push(`${item.diameterMm} mm`);
  if (item.legs && item.legs > 1) parts.push(`${item.legs} legs`);
  if (item.lengthM) parts.push(`${item.lengthM} m`);
  return parts.join(", ");
}

/**
 * The pick for a register item, or null for a kind no plan allocates. A multi-leg
 * sling is marked with the assembly's WLL for legs up to 45 deg; one leg is taken as that over the
 * rule set's mode factor (via the reference tables).
 */
export function toGearPick(
  item: GearItem,
  tables: ReferenceTables,
  ruleSet: RuleSetId = DEFAULT_RULE_SET,
): GearPick | null {
  const role = roleOfKind(item.kind);
  if (!role) return null;
  const base = {
    id: item.id,
    itemCode: item.itemCode,
    role,
    description: describe(item),
    wllKg: item.wllKg,
    thread: item.thread,
    lengthM: item.lengthM,
    status: item.status,
    nextDueOn: item.nextDueOn ?? null,
    massKg: item.massKg ?? null,
  };
  const marked: Wll = { value: item.wllValue, unit: item.wllUnit };
  const identity = {
    itemCode: item.itemCode,
    ...(item.massKg !== null && item.massKg !== undefined ? { massKg: item.massKg } : {}),
  };
  switch (role) {
    case "eyebolt":
      return {
        ...base,
        spec: {
          role,
          eyebolt: {
            family: (item.eyeboltFamily ?? "plain") as EyeboltFamily,
            thread: item.thread ?? "",
            wll: marked,
            ...identity,
          },
        },
      };
    case "shackle":
      return {
        ...base,
        spec: {
          role,
          shackle: {
            type: item.shackleType === "dee" ? "dee" : "bow",
            ...(item.pinType === "screw" || item.pinType === "bolt" ? { pin: item.pinType } : {}),
            wll: marked,
            ...identity,
          },
        },
      };
    case "sling": {
      const legCount = item.legs ?? 1;
      const mode = legCount > 1 ? findModeFactor(tables.modeFactors, legCount === 2 ? 2 : 3, 45, ruleSet) : null;
      return {
        ...base,
        spec: {
          role,
          sling: {
            kind: SLING_KINDS[item.kind]!,
            ...(mode ? { wllKg: item.wllKg / mode.factor, assemblyWll: marked } : { wll: marked }),
            assemblyLegs: legCount,
            ...identity,
            ...(item.diameterMm !== null ? { diameterMm: item.diameterMm } : {}),
            ...(item.chainGrade !== null ? { grade: String(item.chainGrade) } : {}),
          },
        },
      };
    }
    case "masterLink":
      return { ...base, spec: { role, masterLink: { wll: marked, ...identity } } };
    case "beam": {
      const dropLugsM = parseLugPositions(item.dropLugsM);
      const topLugsM = parseLugPositions(item.topLugsM);
      const complete =
        isBeamKind(item.kind) && dropLugsM && topLugsM && item.lengthM !== null && item.beamMassKg !== null;
      return {
        ...base,
        massKg: item.beamMassKg ?? null,
        spec: {
          role,
          beam: complete
            ? {
                kind: item.kind as "beam" | "spreader",
                lengthM: item.lengthM!,
                dropLugsM,
                topLugsM,
                massKg: item.beamMassKg!,
              }
            : null,
        },
      };
    }
    case "crane":
      return {
        ...base,
        spec: {
          role,
          crane: {
            swlKg: item.wllKg,
            swl: marked,
            itemCode: item.itemCode,
            ...(item.hookHeightM !== null ? { maxHookHeightM: item.hookHeightM } : {}),
          },
        },
      };
  }
}

/** The organisation's items for a role matching a text query (code, description, serial, thread), best first. */
export async function searchGearPicks(
  organisationId: number,
  options: { role?: GearRole; query?: string; limit?: number },
  tables: ReferenceTables,
  ruleSet: RuleSetId = DEFAULT_RULE_SET,
) {
  const q = (options.query ?? "").trim().slice(0, 100);
  const like = `%${q.replace(/[%_\\]/g, (c) => `\\${c}`)}%`;
  const LIKE = caseInsensitiveLike(sequelize);
  const items = await GearItem.findAll({
    where: {
      organisationId,
      status: { [Op.ne]: "withdrawn" },
      ...(options.role
        ? { kind: { [Op.in]: [...ROLE_KINDS[options.role]] } }
        : { kind: { [Op.notIn]: [...ROLE_KINDS.beam] } }),
      ...(q
        ? {
            [Op.or]: [
              { itemCode: { [LIKE]: like } },
              { description: { [LIKE]: like } },
              { serial: { [LIKE]: like } },
              { thread: { [LIKE]: like } },
            ],
          }
        : {}),
    },
    order: [
      ["status", "ASC"],
      ["wllKg", "ASC"],
      ["itemCode", "ASC"],
    ],
    limit: Math.min(Math.max(options.limit ?? 50, 1), 200),
  });
  return items.map((i) => toGearPick(i, tables, ruleSet)).filter((p): p is GearPick => p !== null);
}

/** The picks for the given item ids of the organisation (those allocated in a plan). */
export async function gearPicksByIds(
  organisationId: number,
  ids: readonly number[],
  tables: ReferenceTables,
  ruleSet: RuleSetId = DEFAULT_RULE_SET,
) {
  if (ids.length === 0) return [];
  const items = await GearItem.findAll({ where: { organisationId, id: { [Op.in]: [...new Set(ids)] } } });
  return items.map((i) => toGearPick(i, tables, ruleSet)).filter((p): p is GearPick => p !== null);
}
