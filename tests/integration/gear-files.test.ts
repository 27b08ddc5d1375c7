import { describe, expect, it } from "vitest";
import * as filePage from "~/routes/files.$fileId";
import { StoredFile } from "~/models/stored-file.server";
import { checkUpload, contentDisposition, readUploadForm, transactionWithFiles } from "~/utils/uploads.server";
import { callRoute, getRequest, makeUser } from "../support/factories";
import { ELF_BYTES, PDF_BYTES, PNG_BYTES, postMultipart } from "../support/gear";

async function storeFile(
  user: { id: number; organisationId: number },
  bytes: Uint8Array,
  name: string,
  accepted: Array<"pdf" | "png" | "jpeg">,
) {
  const checked = await checkUpload(new File([bytes as Uint8Array<ArrayBuffer>], name), accepted);
  if (!checked.ok) throw new Error(checked.message);
  return transactionWithFiles((_t, store) =>
    store(checked.upload, { organisationId: user.organisationId, purpose: "drawing", uploadedBy: user.id }),
  );
}

describe("serving stored files", () => {
  it("gives a PDF to a signed-in user of the owning organisation, as an attachment with its stored type and nosniff", async () => {
    const admin = await makeUser(["admin"]);
    const rigger = await makeUser(["rigger"], { organisationId: admin.organisationId });
    const file = await storeFile(admin, PDF_BYTES, "Cert ✓ 12.pdf", ["pdf"]);
    const res = await callRoute(filePage.loader, await getRequest(`/files/${file.id}`, rigger), {
      fileId: String(file.id),
    });
    expect(res.status).toBe(200);
    expect(res.headers.get("Content-Type")).toBe("application/pdf");
    expect(res.headers.get("Content-Disposition")).toBe(
      `attachment; filename="Cert _ 12.pdf"; filename*=UTF-8''Cert%20%E2%9C%93%2012.pdf`,
    );
    expect(res.headers.get("X-Content-Type-Options")).toBe("nosniff");
    expect(res.data).toBe(new TextDecoder().decode(PDF_BYTES));
  });

  it("stores a PNG named .pdf as the PNG it is, when pictures are accepted, and shows it inline", async () => {
    const admin = await makeUser(["admin"]);
    const file = await storeFile(admin, PNG_BYTES, "photo.pdf", ["pdf", "png", "jpeg"]);
    expect(file.contentType).toBe("image/png");
    const res = await callRoute(filePage.loader, await getRequest(`/files/${file.id}`, admin), {
      fileId: String(file.id),
    });
    expect(res.headers.get("Content-Type")).toBe("image/png");
    expect(res.headers.get("Content-Disposition")).toMatch(/^inline;/);
  });

  it("is not found for another organisation, a bad id or missing bytes, and asks anonymous visitors to sign in", async () => {
    const admin = await makeUser(["admin"]);
    const file = await storeFile(admin, PDF_BYTES, "c.pdf", ["pdf"]);
    const stranger = await makeUser(["admin"]);
    expect(
      (await callRoute(filePage.loader, await getRequest(`/files/${file.id}`, stranger), { fileId: String(file.id) }))
        .status,
    ).toBe(404);
    expect((await callRoute(filePage.loader, await getRequest("/files/abc", admin), { fileId: "abc" })).status).toBe(
      404,
    );
    const anonymous = await callRoute(filePage.loader, await getRequest(`/files/${file.id}`), {
      fileId: String(file.id),
    });
    expect(anonymous.status).toBe(302);
    const orphan = await StoredFile.create({
      organisationId: admin.organisationId,
      storageKey: "0".repeat(32),
      purpose: "drawing",
      originalName: "x.pdf",
      contentType: "application/pdf",
      sizeBytes: 1,
      uploadedBy: admin.id,
    });
    expect(
      (await callRoute(filePage.loader, await getRequest(`/files/${orphan.id}`, admin), { fileId: String(orphan.id) }))
        .status,
    ).toBe(404);
  });
});

describe("upload handling", () => {
  it("refuses executables by content whatever the name", async () => {
    const checked = await checkUpload(
      new File([ELF_BYTES as Uint8Array<ArrayBuffer>], "drawing.png", { type: "image/png" }),
      ["pdf", "png", "jpeg"],
    );
    expect(checked).toEqual({
      ok: false,
      message:
        '"drawing.png" is a Linux program (ELF) by its content, whatever its name says; this needs a PDF or a PNG image or a JPEG image.',
    });
  });

  it("keeps only the base name of an uploaded file", async () => {
    const checked = await checkUpload(
      new File([PDF_BYTES as Uint8Array<ArrayBuffer>], "..\\..\\etc/pass\u0007wd.pdf"),
      ["pdf"],
    );
    expect(checked).toMatchObject({ ok: true, upload: { originalName: "passwd.pdf", kind: "pdf" } });
  });

  it("reads files up to the limit and refuses one over it with a message", async () => {
    const ok = await readUploadForm(
      await postMultipart("/x", { a: "1" }, { file: { bytes: new Uint8Array(1000), name: "f.bin" } }),
      { maxFileBytes: 1000 },
    );
    expect(ok.ok && (ok.formData.get("file") as File).size).toBe(1000);
    const over = await readUploadForm(
      await postMultipart("/x", { a: "1" }, { file: { bytes: new Uint8Array(1001), name: "f.bin" } }),
      { maxFileBytes: 1000 },
    );
    expect(over).toMatchObject({ ok: false, status: 413, message: expect.stringContaining("larger than") });
  });

  it("removes bytes it wrote when the transaction rolls back", async () => {
    const admin = await makeUser(["admin"]);
    const before = await StoredFile.count();
    const checked = await checkUpload(new File([PDF_BYTES as Uint8Array<ArrayBuffer>], "c.pdf"), ["pdf"]);
    if (!checked.ok) throw new Error(checked.message);
    let key = "";
    await expect(
      transactionWithFiles(async (_t, store) => {
        key = (
          await store(checked.upload, {
            organisationId: admin.organisationId,
            purpose: "drawing",
            uploadedBy: admin.id,
          })
        ).storageKey;
        throw new Error("later step failed");
      }),
    ).rejects.toThrow("later step failed");
    expect(await StoredFile.count()).toBe(before);
    const { readStoredBytes } = await import("~/utils/uploads.server");
    expect(await readStoredBytes({ storageKey: key })).toBeNull();
  });

  it("writes file names safely into Content-Disposition", () => {
    expect(contentDisposition("attachment", 'a"b\\c.pdf')).toBe(
      `attachment; filename="a_b_c.pdf"; filename*=UTF-8''a%22b%5Cc.pdf`,
    );
  });
});
