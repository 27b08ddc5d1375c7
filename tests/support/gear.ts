// Helpers shared by the gear register's integration tests.
import { createGearItem } from "~/models/gear-item.server";
import { createSite } from "~/models/site.server";
import type { SessionUser } from "~/models/user.server";
import { BLANK_GEAR_FIELDS, type GearItemInput } from "~/gear/schema";
import { makeUser, sessionCookie } from "./factories";

const BASE = "http://localhost:3000";

export const SHACKLE_FIELDS = {
  itemCode: "T-SH-1",
  kind: "shackle",
  description: "Bow shackle 2 t",
  manufacturer: "",
  serial: "",
  wllValue: "2",
  wllUnit: "t",
  shackleType: "bow",
  pinType: "screw",
  diameterMm: "13",
} as const;

export { BLANK_GEAR_FIELDS };

/** An item straight into the register (no route), a bow shackle unless told otherwise. */
export async function makeGearItem(
  user: Pick<SessionUser, "id" | "organisationId">,
  input: Partial<GearItemInput> = {},
) {
  return createGearItem(
    user.organisationId,
    {
      ...BLANK_GEAR_FIELDS,
      itemCode: `T-${Math.random().toString(36).slice(2, 8)}`,
      kind: "shackle",
      wllValue: 2,
      wllUnit: "t",
      shackleType: "bow",
      pinType: "screw",
      ...input,
    },
    user.id,
  );
}

/** An admin of a fresh organisation with one site, and a rigger of the same organisation. */
export async function adminWithSite(siteName = "Test works, pump house") {
  const admin = await makeUser(["admin"]);
  const rigger = await makeUser(["rigger"], { organisationId: admin.organisationId, name: "Rhys Rigger" });
  const site = await createSite(
    admin.organisationId,
    { name: siteName, customer: "Test Water", address: "", siteContact: "", notes: "" },
    admin.id,
  );
  return { admin, rigger, site };
}

/** A multipart POST (as a browser sends a form with a file), signed in as `user` when given. */
export async function postMultipart(
  pathname: string,
  fields: Record<string, string>,
  files: Record<string, { bytes: Uint8Array | string; name: string; type?: string }> = {},
  user?: Pick<SessionUser, "id">,
) {
  const body = new FormData();
  for (const [key, value] of Object.entries(fields)) body.append(key, value);
  for (const [key, file] of Object.entries(files)) {
    const bytes = typeof file.bytes === "string" ? new TextEncoder().encode(file.bytes) : file.bytes;
    body.append(
      key,
      new File([bytes as Uint8Array<ArrayBuffer>], file.name, { type: file.type ?? "application/octet-stream" }),
    );
  }
  return new Request(BASE + pathname, {
    method: "POST",
    body,
    headers: { Origin: BASE, ...(user ? { Cookie: await sessionCookie(user) } : {}) },
  });
}

export const PDF_BYTES = new TextEncoder().encode("%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n");
export const PNG_BYTES = new Uint8Array([
  0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52,
]);
export const ELF_BYTES = new Uint8Array([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0, 0, 0, 0, 0]);
export const MZ_BYTES = new Uint8Array([0x4d, 0x5a, 0x90, 0, 3, 0, 0, 0]);
